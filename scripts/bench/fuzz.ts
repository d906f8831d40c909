// The fuzz test's 1,000 damaged sample takes, timed: the slowest single file matters
// (a hang or a quadratic path would show here first).
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { AnalysisError, analyseMidi } from "~/analysis";
import { mutations } from "../../tests/support/midiMutations";

export function benchFuzz(): string[] {
  const samples = readdirSync("samples")
    .filter((f) => f.endsWith(".mid"))
    .map((f) => new Uint8Array(readFileSync(path.join("samples", f))));
  let slowest = { ms: 0, label: "" };
  let total = 0;
  const outcome = { analysed: 0, refused: 0 };
  for (const m of mutations(samples, 1000, 20261201)) {
    const t = performance.now();
    try {
      analyseMidi(m.bytes);
      outcome.analysed++;
    } catch (e) {
      if (!(e instanceof AnalysisError)) throw e;
      outcome.refused++;
    }
    const ms = performance.now() - t;
    total += ms;
    if (ms > slowest.ms) slowest = { ms, label: `#${m.index}, ${m.kind}` };
  }
  return [
    "## Fuzzed takes",
    `1,000 damaged sample takes (seed 20261201): ${outcome.analysed} analysed, ${outcome.refused} refused with a typed error`,
    `slowest file: ${slowest.ms.toFixed(1)} ms (${slowest.label}); all 1,000 in ${total.toFixed(0)} ms`,
  ];
}
