// Where each difference from the exercise sits in the chord strip. A wrong or extra chord sits
// on the chord played; a missing one sits between two played chords. The engine lists the
// differences in the order of its alignment and leaves matched chords out, so the place of a
// missing chord is worked out by replaying that alignment: the looped target advances on every
// matched or missing step, the take on every matched or extra step (RULES.md "Matching a take to
// a target"; repeats collapse in take and target alike).
import { parseKey, pc } from "~/analysis/pitch";
import { parseProgression, type TargetChord } from "~/analysis/progression";
import type { ChordReport, Mismatch, TakeAnalysis } from "~/analysis/types";

export type PlacedMismatch = { mismatch: Mismatch; onChord: number | null; afterChord: number | null };

const sameTarget = (x: TargetChord, y: TargetChord) =>
  x.root === y.root &&
  x.triad === y.triad &&
  x.bass === y.bass &&
  x.required.length === y.required.length &&
  x.required.every((r) => y.required.includes(r));

const playedId = (c: ChordReport) =>
  `${pc(c.notes[0])}|${[...new Set(c.notes.map(pc))].sort((a, b) => a - b).join(",")}`;

/** Index of the first chord of each run of identical chords (the engine's collapsed take). */
function collapsedTake(chords: readonly ChordReport[]): number[] {
  const out: number[] = [];
  chords.forEach((c, i) => {
    if (out.length === 0 || playedId(chords[out[out.length - 1]]) !== playedId(c)) out.push(i);
  });
  return out;
}

/** Position of (target index, pass) in the looped, collapsed target. */
function loopedPositions(target: readonly TargetChord[], loops: number): Map<string, number> {
  const unit: number[] = [];
  target.forEach((t, j) => {
    if (unit.length === 0 || !sameTarget(target[unit[unit.length - 1]], t)) unit.push(j);
  });
  const positions = new Map<string, number>();
  let last: number | null = null;
  let n = 0;
  for (let pass = 0; pass < loops; pass++) {
    for (const index of unit) {
      if (last === null || !sameTarget(target[last], target[index])) positions.set(`${index}:${pass}`, n++);
      last = index;
    }
  }
  return positions;
}

export function placeMismatches(analysis: Pick<TakeAnalysis, "chords" | "summary">): PlacedMismatch[] {
  const { summary, chords } = analysis;
  const mismatches = summary.mismatches ?? [];
  if (!summary.target || mismatches.length === 0) return [];
  let target: TargetChord[];
  try {
    target = parseProgression(summary.target, parseKey(summary.key));
  } catch {
    return mismatches.map((m) => ({ mismatch: m, onChord: m.playedIndex, afterChord: null }));
  }
  const positions = loopedPositions(target, summary.loops ?? 1);
  const take = collapsedTake(chords);
  let missingSoFar = 0;
  let extraSoFar = 0;
  return mismatches.map((m) => {
    if (m.kind === "extra") extraSoFar++;
    if (m.kind !== "missing") return { mismatch: m, onChord: m.playedIndex, afterChord: null };
    const s = positions.get(`${m.targetIndex}:${m.pass ?? 0}`) ?? 0;
    // Steps so far: s target chords passed, of which `missingSoFar` were missing, so the rest
    // were matched or wrongly played, each with a played chord; extras took a played chord too.
    const playedSoFar = s - missingSoFar + extraSoFar;
    missingSoFar++;
    // After the last chord of the run the take had reached (-1: before the first chord).
    const run = Math.min(playedSoFar, take.length) - 1;
    return { mismatch: m, onChord: null, afterChord: run < 0 ? -1 : (take[run + 1] ?? chords.length) - 1 };
  });
}
