// `npm run bench`: timings recorded in BENCHMARKS.md. Each section is its own function so later
// sections (page render times, the board) can be added beside it.
import "./lib/production";
import tonejsMidi from "@tonejs/midi";
import { analyseMidi } from "../app/analysis/index";
import { median } from "./bench/stats";
import { denseChordTake } from "./lib/denseTake";
import { generateLongTake } from "./lib/takeGenerator";
import { longTextureTake, writeTexture } from "./lib/textureTakes";

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

function benchOneTake(label: string, bytes: Uint8Array): string[] {
  const notes = new Midi(bytes).tracks.reduce((n, t) => n + t.notes.length, 0);
  // The first call in a fresh process pays for compilation and fills the naming and best-motion caches.
  const coldStart = performance.now();
  const analysis = analyseMidi(bytes);
  const cold = performance.now() - coldStart;
  const [ours, bare] = timeInterleaved([() => analyseMidi(bytes), () => new Midi(bytes)]);
  const ratio = ours / bare;
  return [
    `take: ${label}, ${notes} notes, ${analysis.summary.chordCount} harmonies, ${analysis.melodyNotes.length} melody notes, ${bytes.length} bytes`,
    `  analyseMidi (parse included), median of 25: ${ours.toFixed(1)} ms`,
    `  bare @tonejs/midi parse, median of 25:     ${bare.toFixed(1)} ms`,
    `  ratio: ${ratio.toFixed(2)}×  (target ≤ 3×: ${ratio <= 3 ? "met" : "NOT met"})`,
    `  first analyseMidi call in a fresh process: ${cold.toFixed(1)} ms`,
  ];
}

/** The worst file within the upload limits: random eight-note chords up to the note limit. */
function benchWorstCase(): string[] {
  const bytes = denseChordTake(12_400);
  const times: number[] = [];
  let outcome = "";
  for (let i = 0; i < 3; i++) {
    const t = performance.now();
    try {
      outcome = `graded (${analyseMidi(bytes).summary.chordCount} harmonies)`;
    } catch (e) {
      outcome = `refused: ${(e as { code?: string }).code ?? String(e)}`;
    }
    times.push(performance.now() - t);
  }
  const worst = Math.max(...times);
  return [
    `worst case: 12,400 random eight-note chords (${bytes.length} bytes): ${outcome}`,
    `  slowest of 3: ${worst.toFixed(0)} ms, median ${median(times).toFixed(0)} ms  (target < 2 s: ${worst < 2000 ? "met" : "NOT met"})`,
  ];
}

export function benchAnalysisEngine(): string[] {
  return [
    "## Analysis engine",
    ...benchOneTake("generated 10-minute take of block chords", generateLongTake(10)),
    ...benchOneTake("10-minute pedalled broken chords under a tune", writeTexture(longTextureTake(10))),
    ...benchWorstCase(),
  ];
}

function main() {
  console.log(`Node ${process.version}, ${process.platform}/${process.arch}`);
  for (const line of benchAnalysisEngine()) console.log(line);
}

// `npm run bench` runs every section; `npm run bench -- engine board` only those named.
const only = process.argv.slice(2);
const wanted = (name: string) => only.length === 0 || only.includes(name);
if (wanted("engine")) main();
if (wanted("fuzz")) for (const line of (await import("./bench/fuzz")).benchFuzz()) console.log(line);
if (wanted("board")) for (const line of await (await import("./bench/board")).benchProgressBoard()) console.log(line);
if (wanted("take-page")) for (const line of await (await import("./bench/takePage")).benchTakePage()) console.log(line);
if (wanted("pool")) for (const line of await (await import("./bench/workerPool")).benchWorkerPool()) console.log(line);
process.exit(0);
