import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { AnalysisError, analyseMidi } from "~/analysis";
import { mutations, type Mutant } from "../support/midiMutations";

// 1,000 damaged copies of the sample takes (byte flips, truncations, duplicated
// chunks) made with a fixed seed: each must analyse or fail with a typed error.
const samples = readdirSync("samples")
  .filter((f) => f.endsWith(".mid"))
  .map((f) => new Uint8Array(readFileSync(path.join("samples", f))));

describe("the analyser under damaged input", () => {
  it("analyses or refuses with a typed error, never anything else, and never hangs", () => {
    const outcomes = { analysed: 0, refused: 0 };
    let slowest = 0;
    for (const mutant of mutations(samples, 1000, 20261201)) {
      const started = performance.now();
      try {
        const result = analyseMidi(mutant.bytes);
        expect(result.summary.chordCount).toBe(result.chords.length);
        outcomes.analysed++;
      } catch (e) {
        if (!(e instanceof AnalysisError))
          throw new Error(`${describeMutant(mutant)} threw ${String(e)}`, { cause: e });
        expect(e.message).not.toContain("\n");
        outcomes.refused++;
      }
      const took = performance.now() - started;
      slowest = Math.max(slowest, took);
      // Hang guard only (the benchmark reports real times): 10 s for one file.
      expect(took, describeMutant(mutant)).toBeLessThan(10_000);
    }
    expect(outcomes.analysed + outcomes.refused).toBe(1000);
    // The mutations are varied enough to hit both paths.
    expect(outcomes.analysed).toBeGreaterThan(50);
    expect(outcomes.refused).toBeGreaterThan(50);
  }, 300_000);
});

function describeMutant(m: Mutant) {
  return `mutant #${m.index} (${m.kind} of sample ${m.sample})`;
}
