// Best motion of a change (DOMAIN rule 8): the smallest motion the same change could have had.
//
// Candidates are voicings of B's pitch classes (or, when both chords have a detached bass,
// B's bass as played plus any voicing of upper(B)'s pitch classes above it). They are built
// note by note from the bottom while the motion DP of rule 7 runs one column per note, so a
// partial voicing whose cheapest completion already costs more than the best found is dropped.
// Choices at each step are tried cheapest first, so good candidates come early.

import { pc } from "./pitch";
import { detachedBass, motion } from "./voiceLeading";

export type BestMotionOptions = {
  /** Keeps only candidates it returns true for; must depend on the voicing alone (results are cached). */
  accept?: (v: number[]) => boolean;
  /** Keep B's played top note. */
  keepTop?: boolean;
  /** Keep B's played bass. */
  keepBass?: boolean;
};

export type BestMotionResult = { motion: number; voicing: number[] };

/** Chords with more distinct pitches than this are not graded (flag `too-many-notes`). */
export const MAX_GRADED_PITCHES = 8;
/** Candidate notes lie within this many semitones of A's lowest and highest notes. */
const SEARCH_MARGIN = 12;
const LOWEST_KEY = 21; // A0
const HIGHEST_KEY = 108; // C8
/** Hang guard: search steps per call. Far above what real voicings need (a few hundred). */
const STEP_BUDGET = 200_000;

const plainCache = new Map<string, BestMotionResult | null>();
const acceptCaches = new WeakMap<(v: number[]) => boolean, Map<string, BestMotionResult | null>>();
const CACHE_LIMIT = 20_000;

function distinctSorted(v: readonly number[]): number[] {
  return Array.from(new Set(v)).sort((x, y) => x - y);
}

/** Tie-break of rule 8: the top note that moves least, then the lower top note. */
function beatsOnTie(candidateTop: number, bestTop: number, aTop: number): boolean {
  const dc = Math.abs(candidateTop - aTop);
  const db = Math.abs(bestTop - aTop);
  return dc < db || (dc === db && candidateTop < bestTop);
}

/**
 * The smallest motion from A to any allowed voicing of B, with that voicing (ascending), or
 * null when no candidate is accepted or either chord has more than 8 distinct pitches.
 */
export function bestMotion(
  aIn: readonly number[],
  bIn: readonly number[],
  opts: BestMotionOptions = {},
): BestMotionResult | null {
  const a = aIn.slice().sort((x, y) => x - y);
  const b = distinctSorted(bIn);
  if (a.length === 0 || b.length === 0) throw new RangeError("bestMotion needs two non-empty voicings");
  if (b.length > MAX_GRADED_PITCHES || new Set(a).size > MAX_GRADED_PITCHES) return null;

  const key = `${a.join(",")}|${b.join(",")}|${opts.keepTop ? 1 : 0}${opts.keepBass ? 1 : 0}`;
  let cache = plainCache;
  if (opts.accept) {
    cache = acceptCaches.get(opts.accept) ?? new Map();
    acceptCaches.set(opts.accept, cache);
  }
  let result = cache.get(key);
  if (result === undefined) {
    result = search(a, b, opts);
    if (cache.size >= CACHE_LIMIT) cache.clear();
    cache.set(key, result);
  }
  return result && { motion: result.motion, voicing: result.voicing.slice() };
}

function search(a: number[], b: number[], opts: BestMotionOptions): BestMotionResult | null {
  const accept = opts.accept ?? (() => true);
  const m = a.length;
  const n = b.length;
  const aTop = a[m - 1];

  let bestCost = Infinity;
  let bestVoicing: number[] | null = null;
  // B as played is always a candidate (rule 8).
  if (accept(b.slice())) {
    bestCost = motion(a, b);
    bestVoicing = b.slice();
  }

  const bothDetached = detachedBass(a) !== null && detachedBass(b) !== null;
  const fixedLow = bothDetached || opts.keepBass ? b[0] : null;
  const fixedTop = opts.keepTop ? b[n - 1] : null;
  if (n === 1 && fixedLow !== null && fixedTop !== null) return finish();

  // Pitch classes still to place freely (a multiset: upper(B) may double a pitch class).
  const counts = new Array<number>(12).fill(0);
  for (const note of b) counts[pc(note)]++;
  if (fixedLow !== null) counts[pc(fixedLow)]--;
  if (fixedTop !== null) counts[pc(fixedTop)]--;

  let lo = Math.max(LOWEST_KEY, a[0] - SEARCH_MARGIN);
  let hi = Math.min(HIGHEST_KEY, aTop + SEARCH_MARGIN);
  if (fixedLow !== null) lo = Math.max(lo, fixedLow + 1);
  if (fixedTop !== null) hi = Math.min(hi, fixedTop - 1);

  // Rule 7's DP, one column per placed note: col[i] = cheapest joins of a[0..i] with the
  // notes placed so far, a[i] joined to the newest one.
  const maxChoices = 12 * 10;
  const columns = Array.from({ length: n }, () => new Float64Array(maxChoices * m));
  const path = new Array<number>(n).fill(0);
  let steps = 0;

  function fillColumn(out: Float64Array, offset: number, prev: Float64Array | null, prevOffset: number, j: number, v: number): number {
    let lowest = Infinity;
    for (let i = 0; i < m; i++) {
      const d = Math.abs(a[i] - v);
      let best: number;
      if (j === 0) {
        best = i === 0 ? 0 : m > n ? out[offset + i - 1] : Infinity;
      } else {
        best = i > 0 ? prev![prevOffset + i - 1] : Infinity;
        if (m > n && i > 0 && out[offset + i - 1] < best) best = out[offset + i - 1];
        if (m < n && prev![prevOffset + i] < best) best = prev![prevOffset + i];
      }
      const c = best + d;
      out[offset + i] = c;
      if (c < lowest) lowest = c;
    }
    return lowest;
  }

  function place(j: number, prevNote: number, prev: Float64Array | null, prevOffset: number): void {
    if (++steps > STEP_BUDGET) return;
    const buf = columns[j];
    const notes: number[] = [];
    const bounds: number[] = [];
    const add = (v: number) => {
      const offset = notes.length * m;
      bounds.push(fillColumn(buf, offset, prev, prevOffset, j, v));
      notes.push(v);
    };
    const last = j === n - 1;
    if (j === 0 && fixedLow !== null) add(fixedLow);
    else if (last && fixedTop !== null) {
      if (fixedTop > prevNote) add(fixedTop);
    } else {
      const start = Math.max(lo, prevNote + 1);
      for (let p = 0; p < 12; p++) {
        if (counts[p] === 0) continue;
        const first = start + ((p - pc(start) + 12) % 12);
        for (let v = first; v <= hi; v += 12) add(v);
      }
    }
    const order = notes.map((_, k) => k).sort((x, y) => bounds[x] - bounds[y] || notes[x] - notes[y]);
    for (const k of order) {
      if (bounds[k] > bestCost) break;
      const v = notes[k];
      path[j] = v;
      if (last) {
        const cost = buf[k * m + m - 1];
        if (cost < bestCost || (cost === bestCost && bestVoicing && beatsOnTie(v, bestVoicing[n - 1], aTop))) {
          const candidate = path.slice();
          if (accept(candidate.slice())) {
            bestCost = cost;
            bestVoicing = candidate;
          }
        }
        continue;
      }
      const isFixed = (j === 0 && fixedLow !== null);
      if (!isFixed) counts[pc(v)]--;
      place(j + 1, v, buf, k * m);
      if (!isFixed) counts[pc(v)]++;
    }
  }

  place(0, -Infinity, null, 0);
  return finish();

  function finish(): BestMotionResult | null {
    return bestVoicing ? { motion: bestCost, voicing: bestVoicing } : null;
  }
}
