import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";

// The production server bundles its packages into build/server, so a cold start reads a few
// files instead of hundreds from node_modules. Left as packages: the native SQLite binding,
// the worker pool (it starts its workers from its own files), and React with React Router,
// which the Express adapter loads too and which must be one copy.
const SERVER_PACKAGES = ["better-sqlite3", "piscina", "react", "react-dom", "react-router", "@react-router/node"];

export default defineConfig(({ command }) => ({
  plugins: [tailwindcss(), reactRouter()],
  resolve: { tsconfigPaths: true },
  server: { host: "127.0.0.1" },
  ssr: command === "build" ? { noExternal: true, external: SERVER_PACKAGES } : undefined,
}));
