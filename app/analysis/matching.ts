// Matching a take to an exercise's target progression (RULES.md "Matching a take to a target").
//
// A played chord matches a target chord when root and triad agree, every interval the target
// names is present (other added tones and sevenths are free) and, when the target has a slash,
// the bass agrees; or when it is a rootless voicing of the target (RULES.md rule 20). Consecutive identical chords count once in take and target. The take may
// loop the target: for k = 1, 2, … the target repeated k times and collapsed is aligned with
// the take, maximising matched minus mismatched chords; the best k wins, the larger on a tie.
//
// Looping and collapsing only ever append to the looped target, so one alignment table over
// the longest looped target answers every k at once (its last row, at each k's length).

import { nameOnRoot } from "./naming";
import { type Key, pc } from "./pitch";
import { ProgressionError, type TargetChord, type Triad } from "./progression";
import { spelledSymbol } from "./spelling";
import type { ChordName } from "./types";

export type PlayedIdentity = { root: number | null; triad: Triad | null; bass: number; pcs: number[] };

export type Mismatch = {
  kind: "missing" | "extra" | "wrong-chord" | "wrong-bass";
  /** Index into the target array given (not the looped one); null for an extra chord. */
  targetIndex: number | null;
  /** Index into the played array given (before repeats were collapsed); null for a missing chord. */
  playedIndex: number | null;
  /** The target chord's symbol; null for an extra chord. */
  expected: string | null;
  /** Which time through the target (0 = first), null for an extra chord. */
  pass: number | null;
};

/** A played chord matched as a rootless voicing of a target chord (RULES.md rule 20). */
export type RootlessMatch = { playedIndex: number; targetIndex: number };

export type MatchResult = {
  accuracy: number;
  loops: number;
  matched: number;
  /** Length of the collapsed, looped target that accuracy divides by. */
  targetLength: number;
  mismatches: Mismatch[];
  /** Matched chords read as rootless voicings of their target; present only when there are some. */
  rootless?: RootlessMatch[];
};

/** Takes longer than this (after collapsing repeats) are matched on their first chords only. */
export const MAX_MATCHED_CHORDS = 4000;

type Verdict = "match" | "wrong-chord" | "wrong-bass";
const VERDICTS: Verdict[] = ["match", "wrong-chord", "wrong-bass"];
const MATCH = 0;

/**
 * Intervals a target names that a played chord must hold. A 13th chord is a 13th with or
 * without its 9th (RULES.md rule 20), so the 9th of a 13th is not required.
 */
function essential(t: TargetChord): number[] {
  const thirteenth = t.required.includes(9) && (t.required.includes(10) || t.required.includes(11));
  return thirteenth ? t.required.filter((i) => i !== 2) : t.required;
}

function verdict(p: PlayedIdentity, t: TargetChord): Verdict {
  const bassOk = t.bass === null || pc(p.bass) === t.bass;
  if (p.root === null || p.triad === null || pc(p.root) !== t.root || p.triad !== t.triad) {
    if (isRootlessOf(p.pcs, t)) return bassOk ? "match" : "wrong-bass";
    return "wrong-chord";
  }
  const played = new Set(p.pcs.map(pc));
  if (!essential(t).every((i) => played.has(pc(t.root + i)))) return "wrong-chord";
  if (!bassOk) return "wrong-bass";
  return "match";
}

const THIRD: Partial<Record<Triad, number>> = { major: 4, minor: 3, diminished: 3, augmented: 4 };
const FIFTH: Partial<Record<Triad, number>> = { major: 7, minor: 7, diminished: 6, augmented: 8 };

/**
 * RULES.md rule 20: whether the played pitch classes are a rootless voicing of the target, a
 * voicing without the target's root that holds its 3rd and 7th and two of its 5th, 9th and
 * 13th, so that the target explains every note (F A C E is a rootless Dm9, F A B E a rootless
 * G13, E G B D a rootless Cmaj9). The target must name its 7th: a plain triad target (IV) is
 * not matched by a four-note chord on another root (A C E G would otherwise pass for F).
 * A dominant target also explains its altered 9ths and flat 13th (b9, #9, b13), since those
 * are its usual tensions (common practice), and any tension the target itself names.
 */
export function isRootlessOf(pcs: readonly number[], target: TargetChord): boolean {
  const third = THIRD[target.triad];
  const fifth = FIFTH[target.triad];
  if (third === undefined || fifth === undefined) return false; // sus chords have no 3rd
  const played = new Set(pcs.map((p) => pc(p - target.root)));
  if (played.size !== 4 || played.has(0) || !played.has(third)) return false;
  const sevenths = target.triad === "diminished" ? [9, 10] : [10, 11];
  const seventh = target.required.find((i) => sevenths.includes(i) && played.has(i));
  if (seventh === undefined) return false;
  const dominant = target.triad === "major" && seventh === 10;
  const tensions = new Set([fifth, 2, 9, ...target.required.filter((i) => i !== seventh)]);
  if (dominant) for (const i of [1, 3, 8]) tensions.add(i);
  const rest = [...played].filter((i) => i !== third && i !== seventh);
  return rest.length === 2 && rest.every((i) => tensions.has(i));
}

/**
 * The chord a rootless voicing is read as against its target (rule 20: against a target the
 * name follows that reading): F A B E against G7 is G13, B D F# A against Gmaj7 is Gmaj9.
 * Null when the pitch classes are not a rootless voicing of the target.
 */
export function rootlessReading(pcs: readonly number[], target: TargetChord): ChordName | null {
  if (!isRootlessOf(pcs, target)) return null;
  return nameOnRoot(pcs, target.root);
}

/**
 * The rootless reading's lead-sheet symbol spelled in the key, without a slash: the lowest
 * note of a rootless voicing is not a bass the player chose (`G13`, `Gmaj9`).
 */
export function rootlessSymbol(pcs: readonly number[], target: TargetChord, key: Key | null): string | null {
  const name = rootlessReading(pcs, target);
  return name === null ? null : spelledSymbol(name, target.root, key);
}

function samePlayed(x: PlayedIdentity, y: PlayedIdentity): boolean {
  if (x.root !== y.root || x.triad !== y.triad || pc(x.bass) !== pc(y.bass)) return false;
  const xs = new Set(x.pcs.map(pc));
  const ys = new Set(y.pcs.map(pc));
  return xs.size === ys.size && [...xs].every((v) => ys.has(v));
}

function sameTarget(x: TargetChord, y: TargetChord): boolean {
  return (
    x.root === y.root &&
    x.triad === y.triad &&
    x.bass === y.bass &&
    x.required.length === y.required.length &&
    x.required.every((r) => y.required.includes(r))
  );
}

const DIAG = 0;
const EXTRA = 1;
const MISSING = 2;

export function matchProgression(played: PlayedIdentity[], target: TargetChord[]): MatchResult {
  if (target.length === 0) throw new ProgressionError("The target progression is empty");

  // Collapse repeats, remembering where each collapsed chord came from.
  const takeIdx: number[] = [];
  for (let i = 0; i < played.length && takeIdx.length < MAX_MATCHED_CHORDS; i++) {
    if (takeIdx.length === 0 || !samePlayed(played[takeIdx[takeIdx.length - 1]], played[i])) takeIdx.push(i);
  }
  const unit: number[] = [];
  for (let j = 0; j < target.length; j++) {
    if (unit.length === 0 || !sameTarget(target[unit[unit.length - 1]], target[j])) unit.push(j);
  }

  // The looped target for the largest k worth trying, and its collapsed length after each k.
  const P = takeIdx.length;
  // A target that ends on its first chord (I IV V I) collapses that chord at each loop's seam,
  // so each loop after the first adds one chord fewer: enough loops to cover the whole take.
  const seam = unit.length > 1 && sameTarget(target[unit[unit.length - 1]], target[unit[0]]) ? 1 : 0;
  const perLoop = Math.max(1, unit.length - seam);
  const maxLoops = Math.max(1, Math.ceil(P / perLoop) + 1);
  const seq: Array<{ index: number; pass: number }> = [];
  const lengthAt: number[] = [0];
  for (let k = 1; k <= maxLoops; k++) {
    for (const index of unit) {
      const last = seq[seq.length - 1];
      if (!last || !sameTarget(target[last.index], target[index])) seq.push({ index, pass: k - 1 });
    }
    lengthAt.push(seq.length);
  }
  const N = seq.length;

  // verdicts[i * T + j]: played collapsed chord i against target chord j (index into VERDICTS).
  const T = target.length;
  const verdicts = new Uint8Array(P * T);
  for (let i = 0; i < P; i++) {
    for (const j of unit) verdicts[i * T + j] = VERDICTS.indexOf(verdict(played[takeIdx[i]], target[j]));
  }
  const seqIndex = Int32Array.from(seq, (s) => s.index);

  // A plain alignment (played chord i against looped target chord i, the rest gaps) for the
  // k closest to the take's length gives a score every winning alignment reaches. A path with
  // G gaps scores at most P - G, so no winning path strays more than P - that score from the
  // diagonal: only that band of the table is filled. A well-played take gives a narrow band.
  let floor = -Infinity;
  for (let k = 1; k <= maxLoops; k++) {
    const len = lengthAt[k];
    if (Math.abs(P - len) > unit.length + 1 && k !== 1) continue; // any k gives a valid floor
    let score = -Math.abs(P - len);
    for (let i = 0; i < Math.min(P, len); i++) score += verdicts[i * T + seqIndex[i]] === MATCH ? 1 : -1;
    floor = Math.max(floor, score);
  }
  const band = P - floor;

  // score[i][j]: best matched-minus-mismatched aligning i played chords with j looped-target
  // chords; two rows kept. move[]: the step into each cell, stored for the band only.
  const NEG = -(1 << 29);
  const banded = 2 * band + 1 < N + 1;
  const rowWidth = banded ? 2 * band + 1 : N + 1;
  const at = banded
    ? (i: number, j: number) => i * rowWidth + (j - i + band)
    : (i: number, j: number) => i * rowWidth + j;
  const move = new Uint8Array((P + 1) * rowWidth);
  let prevRow = new Int32Array(N + 2).fill(NEG);
  let row = new Int32Array(N + 2).fill(NEG);
  for (let j = 0; j <= Math.min(N, band); j++) {
    prevRow[j] = -j;
    move[at(0, j)] = MISSING;
  }
  for (let i = 1; i <= P; i++) {
    const from = Math.max(1, i - band);
    const to = Math.min(N, i + band);
    // cells just outside the band read as unreachable (rows are reused)
    row[from - 1] = NEG;
    if (i <= band) {
      row[0] = -i;
      move[at(i, 0)] = EXTRA;
    }
    for (let j = from; j <= to; j++) {
      const v = verdicts[(i - 1) * T + seqIndex[j - 1]];
      // On a tie the gap wins here, at the end of the walk back, so that wrongly played
      // chords are reported as early in the take as the alignment allows.
      let best = row[j - 1] - 1;
      let how = MISSING;
      if (prevRow[j] - 1 > best) {
        best = prevRow[j] - 1;
        how = EXTRA;
      }
      const diag = prevRow[j - 1] + (v === MATCH ? 1 : -1);
      if (diag > best) {
        best = diag;
        how = DIAG;
      }
      row[j] = best;
      move[at(i, j)] = how;
    }
    row[to + 1] = NEG;
    [prevRow, row] = [row, prevRow];
  }
  const lastRow = prevRow; // after the swap, the row for i = P

  let bestK = 1;
  for (let k = 2; k <= maxLoops; k++) {
    if (lengthAt[k] === lengthAt[k - 1]) continue; // a one-chord target: looping adds nothing
    if (lastRow[lengthAt[k]] >= lastRow[lengthAt[bestK]]) bestK = k;
  }

  // Walk the alignment back for the chosen k.
  const mismatches: Mismatch[] = [];
  const rootless: RootlessMatch[] = [];
  let matched = 0;
  let i = P;
  let j = lengthAt[bestK];
  while (i > 0 || j > 0) {
    const how = i === 0 ? MISSING : j === 0 ? EXTRA : move[at(i, j)];
    if (how === DIAG) {
      const t = seq[j - 1];
      const v = VERDICTS[verdicts[(i - 1) * T + t.index]];
      if (v === "match") {
        matched++;
        const p = played[takeIdx[i - 1]];
        const tc = target[t.index];
        const plain = p.root !== null && pc(p.root) === tc.root && p.triad === tc.triad;
        if (!plain) rootless.push({ playedIndex: takeIdx[i - 1], targetIndex: t.index });
      } else
        mismatches.push({
          kind: v,
          targetIndex: t.index,
          playedIndex: takeIdx[i - 1],
          expected: target[t.index].symbol,
          pass: t.pass,
        });
      i--;
      j--;
    } else if (how === EXTRA) {
      mismatches.push({ kind: "extra", targetIndex: null, playedIndex: takeIdx[i - 1], expected: null, pass: null });
      i--;
    } else {
      const t = seq[j - 1];
      mismatches.push({
        kind: "missing",
        targetIndex: t.index,
        playedIndex: null,
        expected: target[t.index].symbol,
        pass: t.pass,
      });
      j--;
    }
  }
  mismatches.reverse();
  rootless.reverse();
  const targetLength = lengthAt[bestK];
  const result: MatchResult = { accuracy: matched / targetLength, loops: bestK, matched, targetLength, mismatches };
  if (rootless.length > 0) result.rootless = rootless;
  return result;
}
