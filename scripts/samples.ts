// `npm run samples`: writes the invented demo takes (scripts/lib/sampleTakes.ts) and the takes
// played in the ordinary textures of real playing (scripts/lib/textureTakes.ts) into samples/.
import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { SAMPLE_TAKES } from "./lib/sampleTakes";
import { TEXTURE_TAKES, writeTexture } from "./lib/textureTakes";

const dir = join(process.cwd(), "samples");
mkdirSync(dir, { recursive: true });
for (const s of SAMPLE_TAKES) {
  writeFileSync(join(dir, s.file), s.build());
  console.log(`${s.file.padEnd(32)} ${s.about}`);
}
for (const t of TEXTURE_TAKES) {
  writeFileSync(join(dir, t.file), writeTexture(t));
  console.log(`${t.file.padEnd(40)} ${t.about}`);
}
