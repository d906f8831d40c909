import { type RouteConfig, index } from "@react-router/dev/routes";

export default [index("routes/hello.tsx")] satisfies RouteConfig;
