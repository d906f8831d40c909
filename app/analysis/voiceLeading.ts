// Motion between two voicings (RULES.md rule 7) and the detached bass / upper structure split.
//
// Voice-leading size is the taxicab (L1) norm: D. Tymoczko, "A Geometry of Music" (2011);
// Callender, Quinn & Tymoczko, "Generalized voice-leading spaces", Science 320 (2008).
// Same-sized chords map note to note (sorted lists, sum of |a_i - b_i|). Chords of different
// sizes join each note of the larger to exactly one note of the smaller, every note of the
// smaller at least once, without crossings: a dynamic programme over the sorted lists.

function sorted(v: readonly number[]): number[] {
  return v.slice().sort((x, y) => x - y);
}

/**
 * Cost table of the non-crossing joins between sorted `a` and `b` (RULES.md rule 7).
 * cost[j * m + i] is the cheapest way to join a[0..i] with b[0..j] where a[i] and b[j] are
 * joined last. Only the smaller chord's notes may take part in more than one join.
 */
function joinTable(a: number[], b: number[]): Float64Array {
  const m = a.length;
  const n = b.length;
  const cost = new Float64Array(m * n).fill(Infinity);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < m; i++) {
      const d = Math.abs(a[i] - b[j]);
      if (i === 0 && j === 0) {
        cost[0] = d;
        continue;
      }
      let best = Infinity;
      if (i > 0 && j > 0) best = cost[(j - 1) * m + (i - 1)];
      // a larger: several notes of a merge into b[j].
      if (m > n && i > 0 && cost[j * m + (i - 1)] < best) best = cost[j * m + (i - 1)];
      // b larger: a[i] splits into b[j-1] and b[j].
      if (m < n && j > 0 && cost[(j - 1) * m + i] < best) best = cost[(j - 1) * m + i];
      cost[j * m + i] = best + d;
    }
  }
  return cost;
}

function checkNonEmpty(a: readonly number[], b: readonly number[]): void {
  if (a.length === 0 || b.length === 0) {
    throw new RangeError("motion needs two non-empty voicings");
  }
}

/** Total semitone motion of the change from voicing a to voicing b (RULES.md rule 7). */
export function motion(a: readonly number[], b: readonly number[]): number {
  checkNonEmpty(a, b);
  const sa = sorted(a);
  const sb = sorted(b);
  if (sa.length === sb.length) {
    let total = 0;
    for (let i = 0; i < sa.length; i++) total += Math.abs(sa[i] - sb[i]);
    return total;
  }
  const table = joinTable(sa, sb);
  return table[sa.length * sb.length - 1];
}

/**
 * The joins [from, to] that achieve motion(a, b), in ascending order. Used for the
 * largest single-voice move and for common tones.
 */
export function voiceLeadingPairs(a: readonly number[], b: readonly number[]): Array<[number, number]> {
  checkNonEmpty(a, b);
  const sa = sorted(a);
  const sb = sorted(b);
  const m = sa.length;
  const n = sb.length;
  if (m === n) return sa.map((x, i) => [x, sb[i]] as [number, number]);
  const cost = joinTable(sa, sb);
  const pairs: Array<[number, number]> = [];
  let i = m - 1;
  let j = n - 1;
  for (;;) {
    pairs.push([sa[i], sb[j]]);
    if (i === 0 && j === 0) break;
    const here = cost[j * m + i] - Math.abs(sa[i] - sb[j]);
    if (i > 0 && j > 0 && cost[(j - 1) * m + (i - 1)] === here) {
      i--;
      j--;
    } else if (m > n && i > 0 && cost[j * m + (i - 1)] === here) {
      i--;
    } else {
      j--;
    }
  }
  return pairs.reverse();
}

/** Minimum gap (semitones) under the next note for the lowest note to count as a left-hand bass. */
export const DETACHED_BASS_GAP = 7;

/** The detached bass of a voicing of three or more notes, or null (RULES.md terms). */
export function detachedBass(v: readonly number[]): number | null {
  if (v.length < 3) return null;
  const s = sorted(v);
  return s[1] - s[0] >= DETACHED_BASS_GAP ? s[0] : null;
}

/** The voicing without its detached bass (the whole voicing when there is none), ascending. */
export function upperStructure(v: readonly number[]): number[] {
  const s = sorted(v);
  return detachedBass(s) === null ? s : s.slice(1);
}
