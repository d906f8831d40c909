// Entry of an analysis worker thread in dev, the scripts and vitest, which run the
// TypeScript engine from source: the worker loads it through tsx's scoped loader
// (which leaves any loader the parent process uses alone). The built server uses
// build/server/analysis-worker.js instead, bundled by `npm run build`.
import { tsImport } from "tsx/esm/api";

const task = await tsImport("./task.ts", import.meta.url);

export default task.default;
