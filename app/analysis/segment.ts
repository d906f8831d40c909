// Dividing a take into harmonies (RULES.md rule 15), after B. Pardo & W. Birmingham,
// "Algorithms for Chordal Analysis", Computer Music Journal 26(2), 2002: every strike onset
// is a possible boundary; a span between two boundaries is scored against chord templates by
// how long each pitch class sounds in it (matched weight minus unmatched weight, less a
// charge for each template tone that never sounds); dynamic programming picks the division
// with the best total, less a cost per change. Our additions, from rule 15: spans shorter
// than a harmony may be are charged heavily, silences force a boundary, a lone bass note
// under held notes can never start a harmony, and notes the pedal carried in from before a
// span never count in it. The weights are our own, tuned on the takes `npm run samples`
// writes (see RULES.md, "How Nearnote implements rule 15").
import type { Budget } from "./budget";
import { pc } from "./pitch";
import { boundaryRules, HELD_FOR, type BoundaryRules } from "./boundaries";
import { heardEndOf, type Soundings } from "./sounding";
import type { Strike } from "./strikes";

/** Chord templates for segmentation: triads, sevenths and sus chords (no added-tone chords, rule 15). */
export const TEMPLATES: ReadonlyArray<{ name: string; intervals: readonly number[] }> = [
  { name: "major", intervals: [0, 4, 7] },
  { name: "minor", intervals: [0, 3, 7] },
  { name: "dominant seventh", intervals: [0, 4, 7, 10] },
  { name: "major seventh", intervals: [0, 4, 7, 11] },
  { name: "minor seventh", intervals: [0, 3, 7, 10] },
  { name: "half-diminished", intervals: [0, 3, 6, 10] },
  { name: "diminished", intervals: [0, 3, 6] },
  { name: "diminished seventh", intervals: [0, 3, 6, 9] },
  { name: "augmented", intervals: [0, 4, 8] },
  { name: "suspended fourth", intervals: [0, 5, 7] },
  { name: "seventh suspended fourth", intervals: [0, 5, 7, 10] },
];

/** Sum of the four largest of twelve weights (a template has at most four tones). */
function heaviestFour(w: Float64Array): number {
  let a = 0;
  let b = 0;
  let c = 0;
  let d = 0;
  for (let p = 0; p < 12; p++) {
    const x = w[p];
    if (x > d) {
      if (x > a) {
        d = c;
        c = b;
        b = a;
        a = x;
      } else if (x > b) {
        d = c;
        c = b;
        b = x;
      } else if (x > c) {
        d = c;
        c = x;
      } else d = x;
    }
  }
  return a + b + c + d;
}

/** Population count of a 12-bit mask. */
const POPCOUNT = Uint8Array.from({ length: 4096 }, (_, m) => {
  let c = 0;
  for (let x = m; x; x &= x - 1) c++;
  return c;
});

export { boundaryRules, HELD_FOR, lowestSounding, SILENCE_SEC, type BoundaryRules } from "./boundaries";

/** Rule 15: a harmony lasts at least this long. */
export const MIN_HARMONY_SEC = 0.25;

// Our weights (tuned on the sample library; see RULES.md).
/** Charge for a template tone that never sounds, as a share of the span's mean weight per sounding pitch class. */
const MISSING_CHARGE = 0.6;
/**
 * Charge for a four-note template, as a share of the mean weight: two triads a third apart
 * (G then Em) together fill a seventh chord (Em7 = G6), and rule 15 hears them as two
 * harmonies, never one added-tone chord. A seventh chord that is really played still wins.
 */
const SEVENTH_CHARGE = 0.5;
/** Cost of a change, in weighted seconds. */
const CHANGE_COST = 0.08;
/**
 * Extra cost of a harmony beginning where the bass did not change (the lowest note sounding
 * is not struck there): harmonies change with the bass far more often than over it
 * (Temperley 2001, ch. 6).
 */
const SAME_BASS_COST = 0.3;
/** Extra weight of the first strike's notes and of the bass, to choose the chord of a span (not its length). */
const FIRST_STRIKE_BONUS = 0.5;
const BASS_BONUS = 0.5;
/** A span no longer than this many strikes, or this many seconds, is considered (longer harmonies are joined after). */
const MAX_SPAN_STRIKES = 12;
const MAX_SPAN_SEC = 8;
const TOO_SHORT = 1000;
/** Budget steps for scoring one span against every template (about as long as 4 search steps). */
export const SPAN_STEPS = 4;
const EPS = 1e-9;

export type Template = { rootPc: number; template: number };

export type Segment = {
  /** index of the harmony's first strike */
  first: number;
  /** index after its last strike */
  end: number;
  /** the best template's root and index into TEMPLATES, null for a span that sounds nothing */
  chord: Template | null;
};

export type SegmentInput = {
  /** the take's budget: each span scored spends SPAN_STEPS */
  budget?: Budget;
  strikes: readonly Strike[];
  sounding: Soundings;
  /** end of the take (the last sound) */
  endTime: number;
  /** shortest harmony: MIN_HARMONY_SEC, or about a beat in a take that follows its tempo map */
  minHarmonySec: number;
};

// Every template on every root, flattened for the inner loop of the search: its pitch-class
// mask, its tones (padded to four), their count, and which template and root it is.
const FLAT_COUNT = TEMPLATES.length * 12;
const FLAT_MASK = new Int32Array(FLAT_COUNT);
const FLAT_TONES = new Int32Array(FLAT_COUNT * 4);
const FLAT_SIZE = new Int32Array(FLAT_COUNT);
TEMPLATES.forEach((t, ti) => {
  for (let r = 0; r < 12; r++) {
    const f = ti * 12 + r;
    FLAT_SIZE[f] = t.intervals.length;
    t.intervals.forEach((iv, k) => {
      FLAT_TONES[f * 4 + k] = (r + iv) % 12;
      FLAT_MASK[f] |= 1 << ((r + iv) % 12);
    });
  }
});

/**
 * For each mask of pitch classes present, the flattened templates sharing at least two tones
 * with it (in template order), and each one's charge: built on first use.
 */
const CANDIDATES: Array<Int16Array | undefined> = new Array(4096);
/** Per candidate, its charge as a share of the span's mean weight (missing tones, four-note template). */
const CHARGE: Array<Float64Array | undefined> = new Array(4096);
/** Per candidate, its four tones; a three-note template's fourth is 12, a weight kept at 0. */
const TONES: Array<Int8Array | undefined> = new Array(4096);
function candidatesOf(presentMask: number): Int16Array {
  let list = CANDIDATES[presentMask];
  if (list) return list;
  const fs: number[] = [];
  for (let f = 0; f < FLAT_COUNT; f++) if (POPCOUNT[presentMask & FLAT_MASK[f]] >= 2) fs.push(f);
  list = Int16Array.from(fs);
  const missing = Int8Array.from(fs, (f) => FLAT_SIZE[f] - POPCOUNT[presentMask & FLAT_MASK[f]]);
  CHARGE[presentMask] = Float64Array.from(
    fs,
    (f, c) => MISSING_CHARGE * missing[c] + (FLAT_SIZE[f] > 3 ? SEVENTH_CHARGE : 0),
  );
  TONES[presentMask] = Int8Array.from({ length: 4 * fs.length }, (_, x) => {
    const f = fs[x >> 2];
    return (x & 3) < FLAT_SIZE[f] ? FLAT_TONES[f * 4 + (x & 3)] : 12;
  });
  CANDIDATES[presentMask] = list;
  return list;
}

/**
 * Best template for a weight vector. The score (what the division maximises) is matched
 * minus unmatched weight, less the charges, less the first strike's weight that the template
 * does not explain (a harmony should begin with notes of its chord). The chord chosen weighs
 * the first strike and the bass up (`bonus`), and prefers the bass as root on a tie.
 */
export function bestTemplate(
  w: Float64Array,
  bonus: Float64Array,
  bassPc: number | null,
): { score: number; chord: Template | null } {
  return bestTemplateAt(w, bonus, 0, bassPc);
}

/** bestTemplate with the bonus weights read from `bonus` at `at` (twelve of them). */
function bestTemplateAt(
  w: Float64Array,
  bonus: Float64Array,
  at: number,
  bassPc: number | null,
): { score: number; chord: Template | null } {
  let total = 0;
  let present = 0;
  let bonusTotal = 0;
  let presentMask = 0;
  for (let p = 0; p < 12; p++) {
    total += w[p];
    bonusTotal += bonus[at + p];
    if (w[p] > EPS) {
      present++;
      presentMask |= 1 << p;
    }
  }
  if (present === 0) return { score: 0, chord: null };
  const unit = total / present;
  // One pitch class is no chord (rule 15: the notes must fit a chord).
  const lone = present < 2 ? TOO_SHORT : 0;
  let bestScore = -Infinity;
  let choice = -1;
  let choiceScore = -Infinity;
  // Only templates sharing two tones or more with the span can be its chord.
  const candidates = candidatesOf(presentMask);
  const shareOf = CHARGE[presentMask]!;
  for (let c = 0; c < candidates.length; c++) {
    const f = candidates[c];
    const size = FLAT_SIZE[f];
    let inW = 0;
    let inB = 0;
    for (let k = 0; k < size; k++) {
      const p = FLAT_TONES[f * 4 + k];
      inW += w[p];
      inB += bonus[at + p];
    }
    const charge = unit * shareOf[c];
    const score = 2 * inW - total - charge - (bonusTotal - inB) - lone;
    if (score > bestScore) bestScore = score;
    const chosen = 2 * (inW + inB) - total - bonusTotal - charge + (f % 12 === bassPc ? 1e-6 : 0);
    if (chosen > choiceScore + EPS) {
      choiceScore = chosen;
      choice = f;
    }
  }
  // Nothing fits (one pitch class alone): a span that is no chord at all.
  if (bestScore === -Infinity) return { score: -total - TOO_SHORT, chord: null };
  return { score: bestScore, chord: { rootPc: choice % 12, template: Math.floor(choice / 12) } };
}

/**
 * The score bestTemplateAt gives (the same sums in the same order), without choosing the chord:
 * the search needs only the score of each span it tries, and the chord of the spans it keeps.
 */
function spanScoreAt(w: Float64Array, bonus: Float64Array, at: number): number {
  let total = 0;
  let present = 0;
  let bonusTotal = 0;
  let presentMask = 0;
  for (let p = 0; p < 12; p++) {
    total += w[p];
    bonusTotal += bonus[at + p];
    if (w[p] > EPS) {
      present++;
      presentMask |= 1 << p;
    }
  }
  if (present === 0) return 0;
  const unit = total / present;
  const lone = present < 2 ? TOO_SHORT : 0;
  const candidates = candidatesOf(presentMask);
  if (candidates.length === 0) return -total - TOO_SHORT;
  const shareOf = CHARGE[presentMask]!;
  const tones = TONES[presentMask]!;
  // First a quick pass: each template's score up to terms all templates share (sums in
  // another order, so off by rounding only); then the exact sums, as bestTemplateAt does
  // them, for the templates within rounding of the best. Adding the zero weight at 12 to a
  // three-note template's sums changes none of them.
  const a = SCRATCH;
  for (let p = 0; p < 12; p++) a[p] = 2 * w[p] + bonus[at + p];
  let top = -Infinity;
  for (let c = 0, x = 0; c < candidates.length; c++, x += 4) {
    const s = a[tones[x]] + a[tones[x + 1]] + a[tones[x + 2]] + a[tones[x + 3]] - unit * shareOf[c];
    QUICK[c] = s;
    if (s > top) top = s;
  }
  let bestScore = -Infinity;
  for (let c = 0, x = 0; c < candidates.length; c++, x += 4) {
    if (QUICK[c] < top - ROUNDING) continue;
    let inW = 0;
    let inB = 0;
    for (let k = x; k < x + 4; k++) {
      inW += w[tones[k]];
      inB += bonus[at + tones[k]];
    }
    const charge = unit * shareOf[c];
    const score = 2 * inW - total - charge - (bonusTotal - inB) - lone;
    if (score > bestScore) bestScore = score;
  }
  return bestScore;
}
const SCRATCH = new Float64Array(13);
const QUICK = new Float64Array(FLAT_COUNT);
/** Far more than the rounding error of the quick pass, far less than any real difference in score. */
const ROUNDING = 1e-7;
const BONUS_STRIDE = 13;
/** Far more than the rounding of a span's weights summed in another order, far less than any real score. */
const BOUND_MARGIN = 1e-6;

function sameTemplate(a: Template | null, b: Template | null): boolean {
  if (!a || !b) return a === b;
  // Symmetric chords (augmented, diminished seventh) are one chord on several roots.
  return a.template === b.template && FLAT_MASK[a.template * 12 + a.rootPc] === FLAT_MASK[b.template * 12 + b.rootPc];
}

/** Rule 15: the division of the strikes into harmonies with the best total score. */
export function segment(input: SegmentInput, rules: BoundaryRules = boundaryRules(input)): Segment[] {
  const { strikes, sounding, endTime, minHarmonySec, budget } = input;
  const n = strikes.length;
  if (n === 0) return [];
  const { forced, barred, newBass } = rules;
  const T = strikes.map((s) => s.start);
  T.push(Math.max(endTime, T[n - 1]));
  // Flat arrays of every struck note (strike order): pitch class, onset, heard end, key release.
  const off = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) off[k + 1] = off[k] + strikes[k].notes.length;
  const P = new Int32Array(off[n]);
  const MIDI = new Int32Array(off[n]);
  const START = new Float64Array(off[n]);
  const HEARD = new Float64Array(off[n]);
  const KEYEND = new Float64Array(off[n]);
  strikes.forEach((s, k) =>
    s.notes.forEach((note, q) => {
      const x = off[k] + q;
      P[x] = pc(note.midi);
      MIDI[x] = note.midi;
      START[x] = note.start;
      HEARD[x] = heardEndOf(sounding, note);
      KEYEND[x] = note.end;
    }),
  );
  // Per strike: the notes struck before it whose key is still down (held into a span that
  // starts there, listed in downList from downOff[i] to downOff[i + 1]), and the extra
  // weight its first strike and bass get when choosing a chord (twelve from bonusAt[13 i],
  // and a thirteenth kept at 0).
  const downOff = new Int32Array(n + 1);
  let downList = new Int32Array(Math.max(16, off[n]));
  const bonusAt = new Float64Array(BONUS_STRIDE * n);
  const bassAt = new Int32Array(n).fill(-1);
  const down: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = T[i];
    if (i > 0) for (let x = off[i - 1]; x < off[i]; x++) down.push(x);
    let kept = 0;
    for (let q = 0; q < down.length; q++) if (KEYEND[down[q]] > t0 + EPS) down[kept++] = down[q];
    down.length = kept;
    if (downOff[i] + kept > downList.length) {
      const grown = new Int32Array(Math.max(2 * downList.length, downOff[i] + kept));
      grown.set(downList);
      downList = grown;
    }
    for (let q = 0; q < kept; q++) downList[downOff[i] + q] = down[q];
    downOff[i + 1] = downOff[i] + kept;
    const b = BONUS_STRIDE * i;
    let bass = Infinity;
    for (const x of down) if (KEYEND[x] >= t0 + HELD_FOR - EPS && MIDI[x] < bass) bass = MIDI[x];
    for (let x = off[i]; x < off[i + 1]; x++) {
      bonusAt[b + P[x]] += FIRST_STRIKE_BONUS * Math.min(HEARD[x] - START[x], 1);
      if (MIDI[x] < bass) bass = MIDI[x];
    }
    if (bass !== Infinity) {
      bassAt[i] = pc(bass);
      bonusAt[b + bassAt[i]] += BASS_BONUS;
    }
  }

  // For each span end j, the starts i are tried from j − 1 back: the weights of the notes
  // struck in the span grow one strike at a time, the keys held into it are added per start.
  const best = new Float64Array(n + 1).fill(-Infinity);
  const from = new Int32Array(n + 1).fill(-1);
  best[0] = 0;
  const struck = new Float64Array(12);
  // Weights at index 12 (and each strike's thirteenth bonus) stay 0: see spanScoreAt.
  const w = new Float64Array(13);
  for (let j = 1; j <= n; j++) {
    struck.fill(0);
    let struckTotal = 0;
    const tj = T[j];
    for (let i = j - 1; i >= 0 && j - i <= MAX_SPAN_STRIKES; i--) {
      if (i < j - 1 && (forced[i + 1] || T[j - 1] - T[i] > MAX_SPAN_SEC)) break;
      for (let x = off[i]; x < off[i + 1]; x++) {
        const d = Math.max(0, Math.min(HEARD[x], tj) - START[x]);
        struck[P[x]] += d;
        struckTotal += d;
      }
      if (best[i] === -Infinity) continue;
      const t0 = T[i];
      const barredCost = i > 0 && !forced[i] ? (barred[i] ? TOO_SHORT : 0) + (newBass[i] ? 0 : SAME_BASS_COST) : 0;
      const short = tj - t0 < minHarmonySec - EPS && !(j === n && i === 0) ? TOO_SHORT : 0;
      const charges = (i > 0 ? CHANGE_COST : 0) + short + barredCost;
      // Keys held into the span count while they stay down; pedal-carried notes do not count.
      let heldTotal = 0;
      for (let q = downOff[i]; q < downOff[i + 1]; q++) {
        const x = downList[q];
        heldTotal += Math.max(0, Math.min(KEYEND[x], tj) - t0);
      }
      // No template matches more than the span's four heaviest pitch classes (a bound below
      // the span's whole weight): skip starts whose best possible score cannot win. The whole
      // weight is tried first, as it needs no weight vector; it skips only starts the exact
      // bound below skips too (the margin covers the rounding of sums in another order).
      if (best[j] !== -Infinity && best[i] + struckTotal + heldTotal - charges <= best[j] + EPS - BOUND_MARGIN)
        continue;
      w.set(struck);
      for (let q = downOff[i]; q < downOff[i + 1]; q++) {
        const x = downList[q];
        w[P[x]] += Math.max(0, Math.min(KEYEND[x], tj) - t0);
      }
      let total = 0;
      for (let p = 0; p < 12; p++) total += w[p];
      if (best[j] !== -Infinity && best[i] + 2 * heaviestFour(w) - total - charges <= best[j] + EPS) continue;
      budget?.spend(SPAN_STEPS);
      const sum = best[i] + spanScoreAt(w, bonusAt, BONUS_STRIDE * i) - charges;
      if (sum > best[j] + EPS) {
        best[j] = sum;
        from[j] = i;
      }
    }
  }
  const spans: Segment[] = [];
  // The chord of each span kept, from its weights summed again exactly as the search did.
  for (let j = n; j > 0; j = from[j]) {
    const i = from[j];
    const tj = T[j];
    struck.fill(0);
    for (let k = j - 1; k >= i; k--)
      for (let x = off[k]; x < off[k + 1]; x++) struck[P[x]] += Math.max(0, Math.min(HEARD[x], tj) - START[x]);
    w.set(struck);
    for (let q = downOff[i]; q < downOff[i + 1]; q++) {
      const x = downList[q];
      w[P[x]] += Math.max(0, Math.min(KEYEND[x], tj) - T[i]);
    }
    spans.push({
      first: i,
      end: j,
      chord: bestTemplateAt(w, bonusAt, BONUS_STRIDE * i, bassAt[i] < 0 ? null : bassAt[i]).chord,
    });
  }
  spans.reverse();
  // Spans of one template are one harmony unless a silence divides them: the search splits
  // them only where a harmony outgrew the longest span it considers.
  const out: Segment[] = [];
  for (const s of spans) {
    const prev = out[out.length - 1];
    if (prev && !forced[s.first] && sameTemplate(prev.chord, s.chord)) prev.end = s.end;
    else out.push({ ...s });
  }
  return out;
}
