// Best motion of a change (RULES.md rule 8): the smallest motion the same change could have had.
//
// Candidates are voicings of B's pitch classes (or, when both chords have a detached bass,
// B's bass as played plus any voicing of upper(B)'s pitch classes above it). They are built
// note by note from the bottom while the motion DP of rule 7 runs one column per note, so a
// partial voicing whose cheapest completion already costs more than the best found is dropped.
// Choices at each step are tried cheapest first, so good candidates come early.

import { pc } from "./pitch";
import { DETACHED_BASS_GAP, motion } from "./voiceLeading";

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
const LOWEST_KEY = 21; // A0
const HIGHEST_KEY = 108; // C8
/** Hang guard: search steps per call. Far above what real voicings need (a few hundred). */
const STEP_BUDGET = 200_000;

const plainCache = new Map<string, BestMotionResult | null>();
const acceptCaches = new WeakMap<(v: number[]) => boolean, Map<string, BestMotionResult | null>>();
const CACHE_LIMIT = 20_000;

function distinctSorted(v: readonly number[]): number[] {
  const s = v.slice().sort((x, y) => x - y);
  let k = 0;
  for (let i = 0; i < s.length; i++) if (i === 0 || s[i] !== s[i - 1]) s[k++] = s[i];
  s.length = k;
  return s;
}

/** Whether a sorted voicing has a detached bass (the test of voiceLeading.detachedBass, without copying). */
function hasDetachedBass(sortedV: readonly number[]): boolean {
  return sortedV.length >= 3 && sortedV[1] - sortedV[0] >= DETACHED_BASS_GAP;
}

// Work buffers for the search, allocated once: per placed note, its candidate notes, their
// bounds, their order and their DP columns. A nested call (from inside `accept`) gets its own.
const MAX_CHOICES = 12 * 9;
type Buffers = { notes: Int32Array[]; bounds: Float64Array[]; order: Int32Array[]; columns: Float64Array[] };
function makeBuffers(): Buffers {
  const levels = Array.from({ length: MAX_GRADED_PITCHES }, (_, i) => i);
  return {
    notes: levels.map(() => new Int32Array(MAX_CHOICES)),
    bounds: levels.map(() => new Float64Array(MAX_CHOICES)),
    order: levels.map(() => new Int32Array(MAX_CHOICES)),
    columns: levels.map(() => new Float64Array(MAX_CHOICES * MAX_GRADED_PITCHES)),
  };
}
const sharedBuffers = makeBuffers();
let sharedInUse = false;

/**
 * Tie-break of rule 8: the top note that moves least, then the lower top note. Rule 8 stops
 * there; so that the answer never depends on search order, remaining ties go to the voicing
 * that is lower note by note from the top.
 */
export function beatsOnTie(candidate: readonly number[], best: readonly number[], aTop: number): boolean {
  const ct = candidate[candidate.length - 1];
  const bt = best[best.length - 1];
  const dc = Math.abs(ct - aTop);
  const db = Math.abs(bt - aTop);
  if (dc !== db) return dc < db;
  for (let i = 1; i <= Math.min(candidate.length, best.length); i++) {
    const c = candidate[candidate.length - i];
    const b = best[best.length - i];
    if (c !== b) return c < b;
  }
  return false;
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
  const a = distinctSorted(aIn);
  const b = distinctSorted(bIn);
  if (a.length === 0 || b.length === 0) throw new RangeError("bestMotion needs two non-empty voicings");
  if (b.length > MAX_GRADED_PITCHES || a.length > MAX_GRADED_PITCHES) return null;

  const key = `${a.join(",")}|${b.join(",")}|${opts.keepTop ? 1 : 0}${opts.keepBass ? 1 : 0}`;
  let cache = plainCache;
  if (opts.accept) {
    cache = acceptCaches.get(opts.accept) ?? new Map();
    acceptCaches.set(opts.accept, cache);
  }
  let result = cache.get(key);
  if (result === undefined) {
    const nested = sharedInUse;
    sharedInUse = true;
    try {
      result = search(a, b, opts, nested ? makeBuffers() : sharedBuffers);
    } finally {
      if (!nested) sharedInUse = false;
    }
    if (cache.size >= CACHE_LIMIT) cache.clear();
    cache.set(key, result);
  }
  return result && { motion: result.motion, voicing: result.voicing.slice() };
}

function search(a: number[], b: number[], opts: BestMotionOptions, buffers: Buffers): BestMotionResult | null {
  const accept = opts.accept;
  const m = a.length;
  const n = b.length;
  const aTop = a[m - 1];

  let bestCost = Infinity;
  let bestVoicing: number[] | null = null;
  // B as played is always a candidate (rule 8).
  if (!accept || accept(b.slice())) {
    bestCost = motion(a, b);
    bestVoicing = b.slice();
  }

  const bothDetached = hasDetachedBass(a) && hasDetachedBass(b);
  const fixedLow = bothDetached || opts.keepBass ? b[0] : null;
  const fixedTop = opts.keepTop ? b[n - 1] : null;
  if (n === 1 && fixedLow !== null && fixedTop !== null) return finish();

  // Pitch classes still to place freely (a multiset: upper(B) may double a pitch class).
  const counts = new Int32Array(12);
  for (const note of b) counts[pc(note)]++;
  if (fixedLow !== null) counts[pc(fixedLow)]--;
  if (fixedTop !== null) counts[pc(fixedTop)]--;

  // Without `accept`, no optimal candidate has a free note more than 12 x (largest number of
  // copies of one pitch class) below min(A's lowest, kept top) or above max(A's top, kept
  // bass): moving such a note an octave towards A shortens its joins and nothing else.
  const margin = 12 * Math.max(1, ...counts);
  const lo = Math.min(a[0], fixedTop ?? Infinity) - margin;
  const hi = Math.max(aTop, fixedLow ?? -Infinity) + margin;
  const { notes: notesAt, bounds: boundsAt, order: orderAt, columns: columnsAt } = buffers;
  const path = new Array<number>(n).fill(0);
  let steps = 0;

  run(Math.max(LOWEST_KEY, lo), Math.min(HIGHEST_KEY, hi));
  if (accept) {
    // With `accept` the argument above fails; any voicing with a note outside [lo, hi] costs
    // more than `outside`, so search the whole keyboard only when that could still win.
    const outside = Math.min(lo > LOWEST_KEY ? a[0] - lo : Infinity, hi < HIGHEST_KEY ? hi - aTop : Infinity);
    if (bestCost > outside) run(LOWEST_KEY, HIGHEST_KEY);
  }
  return finish();

  function finish(): BestMotionResult | null {
    return bestVoicing ? { motion: bestCost, voicing: bestVoicing } : null;
  }

  function run(rangeLo: number, rangeHi: number): void {
    let freeLo = rangeLo;
    let freeHi = rangeHi;
    if (fixedLow !== null) freeLo = Math.max(freeLo, fixedLow + 1);
    if (fixedTop !== null) freeHi = Math.min(freeHi, fixedTop - 1);
    steps = 0;
    place(0, -Infinity, null, 0, freeLo, freeHi);
  }

  /**
   * Rule 7's DP, one column per placed note: out[i] = cheapest joins of a[0..i] with the notes
   * placed so far, a[i] joined to the newest note v. Returns a lower bound on any completion:
   * notes of A above a[i] must still join notes at or above v.
   */
  function fillColumn(out: Float64Array, off: number, prev: Float64Array | null, prevOff: number, j: number, v: number): number {
    for (let i = 0; i < m; i++) {
      const d = Math.abs(a[i] - v);
      let best: number;
      if (j === 0) {
        best = i === 0 ? 0 : m > n ? out[off + i - 1] : Infinity;
      } else {
        best = i > 0 ? prev![prevOff + i - 1] : Infinity;
        if (m > n && i > 0 && out[off + i - 1] < best) best = out[off + i - 1];
        if (m < n && prev![prevOff + i] < best) best = prev![prevOff + i];
      }
      out[off + i] = best + d;
    }
    let lowest = Infinity;
    let tail = 0;
    for (let i = m - 1; i >= 0; i--) {
      const c = out[off + i] + tail;
      if (c < lowest) lowest = c;
      if (v > a[i]) tail += v - a[i];
    }
    return lowest;
  }

  function place(j: number, prevNote: number, prev: Float64Array | null, prevOff: number, freeLo: number, freeHi: number): void {
    if (++steps > STEP_BUDGET) return;
    const notes = notesAt[j];
    const bounds = boundsAt[j];
    const order = orderAt[j];
    const cols = columnsAt[j];
    const last = j === n - 1;
    let count = 0;
    const push = (v: number) => {
      notes[count] = v;
      bounds[count] = fillColumn(cols, count * m, prev, prevOff, j, v);
      // insertion into `order`, cheapest bound first, then lower note
      let k = count;
      while (k > 0) {
        const o = order[k - 1];
        if (bounds[o] < bounds[count] || (bounds[o] === bounds[count] && notes[o] < v)) break;
        order[k] = o;
        k--;
      }
      order[k] = count;
      count++;
    };
    if (j === 0 && fixedLow !== null) push(fixedLow);
    else if (last && fixedTop !== null) {
      if (fixedTop > prevNote) push(fixedTop);
    } else {
      const start = Math.max(freeLo, prevNote + 1);
      for (let p = 0; p < 12; p++) {
        if (counts[p] === 0) continue;
        for (let v = start + ((p - pc(start) + 12) % 12); v <= freeHi; v += 12) push(v);
      }
    }
    const isFixed = j === 0 && fixedLow !== null;
    for (let r = 0; r < count; r++) {
      const k = order[r];
      if (bounds[k] > bestCost) break;
      const v = notes[k];
      path[j] = v;
      if (last) {
        const cost = cols[k * m + m - 1];
        if (cost < bestCost || (cost === bestCost && bestVoicing !== null && beatsOnTie(path, bestVoicing, aTop))) {
          if (!accept || accept(path.slice())) {
            bestCost = cost;
            bestVoicing = path.slice();
          }
        }
        continue;
      }
      if (!isFixed) counts[pc(v)]--;
      place(j + 1, v, cols, k * m, freeLo, freeHi);
      if (!isFixed) counts[pc(v)]++;
    }
  }
}
