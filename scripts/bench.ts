// `npm run bench`: timings recorded in BENCHMARKS.md. Each section is its own function so later
// sections (page render times, the board) can be added beside it.
import "./lib/production";
import tonejsMidi from "@tonejs/midi";
import { analyseMidi } from "../app/analysis/index";
import { median } from "./bench/stats";
import { generateLongTake } from "./lib/takeGenerator";

const { Midi } = tonejsMidi;


/** Median wall times (ms) of several functions, run interleaved so machine load hits them alike. */
export function timeInterleaved(fns: Array<() => unknown>, runs = 25, warmup = 3): number[] {
  for (let i = 0; i < warmup; i++) for (const fn of fns) fn();
  const times = fns.map(() => [] as number[]);
  for (let i = 0; i < runs; i++) {
    fns.forEach((fn, k) => {
      const t = performance.now();
      fn();
      times[k].push(performance.now() - t);
    });
  }
  return times.map(median);
}

export function benchAnalysisEngine(): string[] {
  const bytes = generateLongTake(10);
  const notes = new Midi(bytes).tracks.reduce((n, t) => n + t.notes.length, 0);
  // The first call in a fresh process pays for compilation and fills the best-motion cache.
  const coldStart = performance.now();
  const analysis = analyseMidi(bytes);
  const cold = performance.now() - coldStart;
  const [ours, bare] = timeInterleaved([() => analyseMidi(bytes), () => new Midi(bytes)]);
  const ratio = ours / bare;
  return [
    "## Analysis engine",
    `take: generated 10-minute take, ${notes} notes, ${analysis.summary.chordCount} chords, ${bytes.length} bytes`,
    `analyseMidi (parse included), median of 25: ${ours.toFixed(1)} ms  (target < 100 ms: ${ours < 100 ? "met" : "NOT met"})`,
    `bare @tonejs/midi parse, median of 25:     ${bare.toFixed(1)} ms`,
    `ratio: ${ratio.toFixed(2)}×  (target ≤ 3×: ${ratio <= 3 ? "met" : "NOT met"})`,
    `first analyseMidi call in a fresh process: ${cold.toFixed(1)} ms`,
  ];
}

function main() {
  console.log(`Node ${process.version}, ${process.platform}/${process.arch}`);
  for (const line of benchAnalysisEngine()) console.log(line);
}

main();
for (const line of (await import("./bench/fuzz")).benchFuzz()) console.log(line);
for (const line of await (await import("./bench/board")).benchProgressBoard()) console.log(line);
for (const line of await (await import("./bench/takePage")).benchTakePage()) console.log(line);
for (const line of await (await import("./bench/workerPool")).benchWorkerPool()) console.log(line);
process.exit(0);
