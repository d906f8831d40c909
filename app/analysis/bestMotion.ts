// Best motion of a change (RULES.md rule 8): the smallest motion the same change could have had.
//
// Candidates are voicings of B's pitch classes (or, when both chords are two-hand voicings,
// B's bass as played, with its left-hand octave if it has one, plus any voicing of upper(B)'s
// pitch classes above it; when the take has a melody, B's top note as played too). They are
// built note by note from the bottom while the motion DP of rule 7 runs one column per note,
// so a partial voicing whose cheapest completion already costs more than the best found is
// dropped. Choices at each step are tried cheapest first, so good candidates come early.
// Every step is paid from a Budget (budget.ts): a search cut short throws and is never cached.

import { Budget, CALL_BUDGET_STEPS } from "./budget";
import { pc } from "./pitch";
import { DETACHED_BASS_GAP, motion } from "./voiceLeading";

export type BestMotionOptions = {
  /** Keeps only candidates it returns true for; must depend on the voicing alone (results are cached). */
  accept?: (v: number[]) => boolean;
  /**
   * A necessary condition for `accept`, tested on the lowest `length` notes of a candidate
   * (ascending, the top note not among them) so that hopeless candidates are dropped early:
   * when it returns false, `accept` refuses every voicing that begins with those notes. `b` is
   * B as played. Only used together with `accept`, and must depend on its arguments alone.
   */
  acceptPrefix?: (prefix: readonly number[], length: number, b: readonly number[]) => boolean;
  /** Keep B's played top note (the tune, when the take has a melody). */
  keepTop?: boolean;
  /** Keep B's played bass (with its left-hand octave, if it has one). */
  keepBass?: boolean;
  /** Only candidates moving less than this count (B as played included); null when none does. */
  below?: number;
  /** Where the search's steps are paid from; without one, each call gets a hang guard of its own. */
  budget?: Budget;
};

export type BestMotionResult = { motion: number; voicing: number[] };

/** Chords with more distinct pitches than this are not graded (flag `too-many-notes`). */
export const MAX_GRADED_PITCHES = 8;
const LOWEST_KEY = 21; // A0
const HIGHEST_KEY = 108; // C8
/** RULES.md terms: no hand reaches a voicing spanning more than this many semitones alone. */
export const ONE_HAND_SPAN = 16;
/** Steps charged for one `accept` test (naming a chord from its cache and checking its flags: ~6 µs). */
const ACCEPT_STEPS = 8;
/** Steps are counted locally and paid to the budget in batches of this many. */
const PAY_EVERY = 1024;

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

/** RULES.md terms: a two-hand voicing has a detached bass or spans more than 16 semitones. */
export function isTwoHand(v: readonly number[]): boolean {
  return isTwoHandSorted(distinctSorted(v));
}

/**
 * The bass a two-hand voicing keeps (RULES.md rules 6 and 8): its lowest note, and the octave
 * above it when that octave is itself 7 or more semitones below the next note (a left-hand
 * octave belongs to the bass). Sorted distinct input.
 */
export function keptBass(sortedB: readonly number[]): number[] {
  const b0 = sortedB[0];
  if (sortedB.length >= 3 && sortedB[1] === b0 + 12 && sortedB[2] - sortedB[1] >= DETACHED_BASS_GAP)
    return [b0, b0 + 12];
  return [b0];
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
 * null when no candidate is accepted (or moves less than `below`) or either chord has more
 * than 8 distinct pitches. Throws AnalysisError("too-complex") when the budget runs out.
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

  const below = opts.below ?? Infinity;
  const key = `${a.join(",")}|${b.join(",")}|${opts.keepTop ? 1 : 0}${opts.keepBass ? 1 : 0}|${below}`;
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
      const budget = opts.budget ?? new Budget(CALL_BUDGET_STEPS);
      // A search cut short throws here, so only finished searches reach the cache.
      result = search(a, b, opts, below, budget, nested ? makeBuffers() : sharedBuffers);
    } finally {
      if (!nested) sharedInUse = false;
    }
    if (cache.size >= CACHE_LIMIT) cache.clear();
    cache.set(key, result);
  }
  return result && { motion: result.motion, voicing: result.voicing.slice() };
}

function search(
  a: number[],
  b: number[],
  opts: BestMotionOptions,
  below: number,
  budget: Budget,
  buffers: Buffers,
): BestMotionResult | null {
  const accept = opts.accept;
  const acceptPrefix = accept ? opts.acceptPrefix : undefined;
  const m = a.length;
  const n = b.length;
  const aTop = a[m - 1];
  let steps = 0;
  const pay = () => {
    const due = steps;
    steps = 0;
    budget.spend(due);
  };
  const accepts = (v: number[]) => {
    steps += ACCEPT_STEPS;
    return !accept || accept(v);
  };

  // Found so far: `bestCost` is also the bound a candidate must meet (strictly below `below`
  // until one is found).
  let bestCost = below;
  let bestVoicing: number[] | null = null;
  // B as played is always a candidate (rule 8).
  const played = motion(a, b);
  if (played < below && accepts(b.slice())) {
    bestCost = played;
    bestVoicing = b.slice();
  }

  // Rule 8: between two-hand voicings the bass (with a left-hand octave) is the player's choice.
  const fixedLow = (isTwoHandSorted(a) && isTwoHandSorted(b)) || opts.keepBass ? keptBass(b) : [];
  const fixedTop = opts.keepTop ? b[n - 1] : null;
  const lowCount = fixedLow.length;
  const lowTop = lowCount > 0 ? fixedLow[lowCount - 1] : null;
  if (lowCount + (fixedTop !== null && fixedTop !== lowTop ? 1 : 0) >= n) return finish();

  // Pitch classes still to place freely (a multiset: upper(B) may double a pitch class).
  const counts = new Int32Array(12);
  for (const note of b) counts[pc(note)]++;
  for (const note of fixedLow) counts[pc(note)]--;
  if (fixedTop !== null) counts[pc(fixedTop)]--;

  // Without `accept`, no optimal candidate has a free note more than 12 x (largest number of
  // copies of one pitch class) below min(A's lowest, kept top) or above max(A's top, kept
  // bass): moving such a note an octave towards A shortens its joins and nothing else.
  const margin = 12 * Math.max(1, ...counts);
  const lo = Math.min(a[0], fixedTop ?? Infinity) - margin;
  const hi = Math.max(aTop, lowTop ?? -Infinity) + margin;
  const { notes: notesAt, bounds: boundsAt, order: orderAt, columns: columnsAt } = buffers;
  const path = new Array<number>(n).fill(0);

  run(Math.max(LOWEST_KEY, lo), Math.min(HIGHEST_KEY, hi));
  if (accept) {
    // With `accept` the argument above fails; any voicing with a note outside [lo, hi] costs
    // more than `outside`, so search the whole keyboard only when that could still win.
    const outside = Math.min(lo > LOWEST_KEY ? a[0] - lo : Infinity, hi < HIGHEST_KEY ? hi - aTop : Infinity);
    if (bestCost > outside) run(LOWEST_KEY, HIGHEST_KEY);
  }
  pay();
  return finish();

  function finish(): BestMotionResult | null {
    return bestVoicing ? { motion: bestCost, voicing: bestVoicing } : null;
  }

  function run(rangeLo: number, rangeHi: number): void {
    let freeLo = rangeLo;
    let freeHi = rangeHi;
    if (lowTop !== null) freeLo = Math.max(freeLo, lowTop + 1);
    if (fixedTop !== null) freeHi = Math.min(freeHi, fixedTop - 1);
    place(0, -Infinity, null, 0, freeLo, freeHi);
  }

  /**
   * Rule 7's DP, one column per placed note: out[i] = cheapest joins of a[0..i] with the notes
   * placed so far, a[i] joined to the newest note v. Returns a lower bound on any completion:
   * notes of A above a[i] must still join notes at or above v.
   */
  function fillColumn(
    out: Float64Array,
    off: number,
    prev: Float64Array | null,
    prevOff: number,
    j: number,
    v: number,
  ): number {
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

  function place(
    j: number,
    prevNote: number,
    prev: Float64Array | null,
    prevOff: number,
    freeLo: number,
    freeHi: number,
  ): void {
    if (steps >= PAY_EVERY) pay();
    const notes = notesAt[j];
    const bounds = boundsAt[j];
    const order = orderAt[j];
    const cols = columnsAt[j];
    const last = j === n - 1;
    let count = 0;
    const push = (v: number) => {
      steps++;
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
    const isFixed = j < lowCount;
    if (isFixed) push(fixedLow[j]);
    else if (last && fixedTop !== null) {
      if (fixedTop > prevNote) push(fixedTop);
    } else {
      const start = Math.max(freeLo, prevNote + 1);
      for (let p = 0; p < 12; p++) {
        if (counts[p] === 0) continue;
        for (let v = start + ((p - pc(start) + 12) % 12); v <= freeHi; v += 12) push(v);
      }
    }
    for (let r = 0; r < count; r++) {
      const k = order[r];
      // A candidate must beat the best found, or move less than `below` while none is found.
      if (bounds[k] > bestCost || (bestVoicing === null && bounds[k] >= bestCost)) break;
      const v = notes[k];
      path[j] = v;
      if (last) {
        const cost = cols[k * m + m - 1];
        const wins =
          bestVoicing === null
            ? cost < bestCost
            : cost < bestCost || (cost === bestCost && beatsOnTie(path, bestVoicing, aTop));
        if (wins && accepts(path.slice())) {
          bestCost = cost;
          bestVoicing = path.slice();
        }
        continue;
      }
      if (acceptPrefix && !acceptPrefix(path, j + 1, b)) continue;
      if (!isFixed) counts[pc(v)]--;
      place(j + 1, v, cols, k * m, freeLo, freeHi);
      if (!isFixed) counts[pc(v)]++;
    }
  }
}

function isTwoHandSorted(s: readonly number[]): boolean {
  return hasDetachedBass(s) || (s.length >= 2 && s[s.length - 1] - s[0] > ONE_HAND_SPAN);
}
