// `npm run bench`: timings recorded in BENCHMARKS.md. Each section is its own function so later
// sections (page render times, the board) can be added beside it.
import tonejsMidi from "@tonejs/midi";
import { analyseMidi } from "../app/analysis/index";
import { generateLongTake } from "./lib/takeGenerator";

const { Midi } = tonejsMidi;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Median wall time of `fn` over `runs` runs after `warmup` unmeasured ones, in ms. */
export function timeIt(fn: () => unknown, runs = 15, warmup = 3): number {
  for (let i = 0; i < warmup; i++) fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    fn();
    times.push(performance.now() - t);
  }
  return median(times);
}

export function benchAnalysisEngine(): string[] {
  const bytes = generateLongTake(10);
  const notes = new Midi(bytes).tracks.reduce((n, t) => n + t.notes.length, 0);
  const analysis = analyseMidi(bytes);
  const bare = timeIt(() => new Midi(bytes));
  const ours = timeIt(() => analyseMidi(bytes));
  const ratio = ours / bare;
  return [
    "## Analysis engine",
    `take: generated 10-minute take, ${notes} notes, ${analysis.summary.chordCount} chords, ${bytes.length} bytes`,
    `analyseMidi (parse included), median: ${ours.toFixed(1)} ms  (target < 100 ms: ${ours < 100 ? "met" : "NOT met"})`,
    `bare @tonejs/midi parse, median:     ${bare.toFixed(1)} ms`,
    `ratio: ${ratio.toFixed(2)}×  (target ≤ 3×: ${ratio <= 3 ? "met" : "NOT met"})`,
  ];
}

function main() {
  console.log(`Node ${process.version}, ${process.platform}/${process.arch}`);
  for (const line of benchAnalysisEngine()) console.log(line);
}

main();
