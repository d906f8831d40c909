// `npm run samples`: writes the invented demo takes (see scripts/lib/sampleTakes.ts) into samples/.
import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { SAMPLE_TAKES } from "./lib/sampleTakes";

const dir = join(process.cwd(), "samples");
mkdirSync(dir, { recursive: true });
for (const s of SAMPLE_TAKES) {
  writeFileSync(join(dir, s.file), s.build());
  console.log(`${s.file.padEnd(32)} ${s.about}`);
}
