// Second half of `npm run build`, after `react-router build`: bundles the Node
// entry points (start, serve, the analysis worker) to plain JavaScript beside the
// server build, so the production server never transpiles TypeScript at run time,
// then prints the JavaScript each page loads against its budget (and keeps it in BUNDLES.md).
import { build } from "esbuild";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { bundleRows, builtGzipSize, formatBundleReport, readBuiltManifest } from "./lib/bundleReport";

const buildDir = path.resolve(process.env.NEARNOTE_BUILD_DIR ?? "build");

await build({
  entryPoints: {
    start: "scripts/start.ts",
    serve: "scripts/serve.ts",
    "analysis-worker": "app/takes/analysisWorker/task.ts",
  },
  outdir: path.join(buildDir, "server"),
  chunkNames: "node-chunks/[name]-[hash]",
  bundle: true,
  // Dynamic imports stay separate chunks, so NODE_ENV is set before React loads.
  splitting: true,
  platform: "node",
  format: "esm",
  target: "node20",
  // Packages are bundled too (a cold start then reads a few files, not hundreds), except
  // those the server build also loads (one copy each), the native SQLite binding and the
  // worker pool, which starts its workers from its own files.
  external: ["better-sqlite3", "piscina", "react", "react-dom", "react-router", "@react-router/node"],
  // Bundled CommonJS packages call require() for Node's own modules.
  banner: {
    js: 'import { createRequire as __nearnoteRequire } from "node:module"; const require = __nearnoteRequire(import.meta.url);',
  },
  sourcemap: true,
  logLevel: "warning",
});
console.log(
  `Node entry points bundled: ${path.relative(process.cwd(), path.join(buildDir, "server"))}/{start,serve,analysis-worker}.js`,
);

const clientDir = path.join(buildDir, "client");
const report = formatBundleReport(bundleRows(readBuiltManifest(clientDir), builtGzipSize(clientDir)));
console.log(report);

// The same table in BUNDLES.md (committed), so a change that grows a page shows in its diff.
const file = "BUNDLES.md";
const text = [
  "# JavaScript per page",
  "",
  "Written by `npm run build` (scripts/build-server.ts); sizes are gzipped, in kB of 1000 bytes.",
  "",
  "```",
  report,
  "```",
  "",
].join("\n");
if (!existsSync(file) || readFileSync(file, "utf8") !== text) writeFileSync(file, text);
