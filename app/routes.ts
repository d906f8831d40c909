import { type RouteConfig, index, route } from "@react-router/dev/routes";

export default [
  index("routes/_index.tsx"),
  route("home", "routes/home.tsx"),
  route("logout", "routes/logout.tsx"),
  route("healthz", "routes/healthz.ts"),
  route("*", "routes/$.tsx"),
] satisfies RouteConfig;
