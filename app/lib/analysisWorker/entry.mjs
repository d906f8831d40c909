// Entry of an analysis worker thread. The engine is TypeScript and the server,
// the scripts and vitest all run it from source, so the worker loads it through
// tsx's scoped loader (which leaves any loader the parent process uses alone).
import { tsImport } from "tsx/esm/api";

const task = await tsImport("./task.ts", import.meta.url);

export default task.default;
