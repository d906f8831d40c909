// The file's tempo map, and steady time (RULES.md rule 22).
//
// Steady time asks how evenly the strikes fall on the beat, not how often the harmony
// changes: a chord held for two bars in strict time is perfectly steady. The beat comes from
// the file's tempo where its strikes follow that grid (a take recorded to a metronome), else
// from the commonest interval between strikes; every interval between consecutive strikes is
// then compared with the nearest whole or half number of beats.
import type { TempoPoint, TempoSteadiness } from "./types";

/** Standard MIDI File 1.0 (MMA, RP-001): 120 bpm until a tempo event says otherwise. */
export const DEFAULT_BPM = 120;
const EPS = 1e-9;

/** Rule 22 (with rule 15): a take follows its tempo map when 80% of its strikes lie within 60 ms of the half-beat grid. */
export const GRID_SHARE = 0.8;
export const GRID_TOLERANCE_SEC = 0.06;
/**
 * Timing differences up to this much are not counted against an interval (our tuning: the
 * order of the timing differences listeners notice between strikes, a few hundredths of a
 * second; from memory, no single source).
 */
export const UNNOTICED_SEC = 0.02;
/** Beats shorter than this (300 bpm) are not considered when the beat is read from the strikes. */
const SHORTEST_BEAT_SEC = 0.2;
/** Where a dense grid could be followed by chance, the map's beat is kept unless the strikes fit a beat of their own better by this much. */
const MAP_PREFERENCE = 0.05;
/**
 * Spread that scores 0. The beat is fitted to the strikes, so even random timing lies a little
 * nearer its grid than chance: intervals two-thirds as far from the grid as chance already
 * count as no steady beat at all (our tuning, against the bounds rule 22 pins).
 */
const ZERO_AT = 2 / 3;
/** A subdivision of the commonest interval is taken as the beat only when it halves the spread. */
const SUBDIVISION_GAIN = 0.5;

/** The tempo in force at `time`: the last tempo point at or before it (binary search; points in time order). */
export function bpmAt(tempos: readonly TempoPoint[], time: number): number {
  let lo = 0;
  let hi = tempos.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (tempos[mid].time <= time + EPS) lo = mid + 1;
    else hi = mid;
  }
  return lo === 0 ? DEFAULT_BPM : tempos[lo - 1].bpm;
}

/** Beats elapsed since time 0 at each tempo point, for beat positions by binary search. */
export type TempoMap = { times: number[]; bpms: number[]; beats: number[] };

export function tempoMap(tempos: readonly TempoPoint[]): TempoMap {
  const times = [0];
  const bpms = [bpmAt(tempos, 0)];
  const beats = [0];
  for (const t of tempos) {
    if (t.time <= EPS || !(t.bpm > 0)) continue;
    const k = times.length - 1;
    beats.push(beats[k] + ((t.time - times[k]) * bpms[k]) / 60);
    times.push(t.time);
    bpms.push(t.bpm);
  }
  return { times, bpms, beats };
}

/** Beat position at `time` and the seconds per beat there. */
export function beatAt(map: TempoMap, time: number): { beat: number; secPerBeat: number } {
  let lo = 0;
  let hi = map.times.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (map.times[mid] <= time + EPS) lo = mid + 1;
    else hi = mid;
  }
  const k = Math.max(0, lo - 1);
  return { beat: map.beats[k] + ((time - map.times[k]) * map.bpms[k]) / 60, secPerBeat: 60 / map.bpms[k] };
}

/** Whether the onsets follow the tempo map's half-beat grid (rules 15 and 22). */
export function followsTempoGrid(onsets: readonly number[], tempos: readonly TempoPoint[]): boolean {
  if (onsets.length === 0) return false;
  const map = tempoMap(tempos);
  let near = 0;
  for (const t of onsets) {
    const { beat, secPerBeat } = beatAt(map, t);
    if (Math.abs(beat - Math.round(beat * 2) / 2) * secPerBeat <= GRID_TOLERANCE_SEC + EPS) near++;
  }
  return near >= GRID_SHARE * onsets.length;
}

/** Steady time as reported: the first edition's fields, plus where the beat came from. */
export type BeatSteadiness = TempoSteadiness & {
  /** the beat the intervals were compared with, seconds (the first one, where the tempo map changes) */
  beatSec: number | null;
  /** "tempo-map" when the strikes follow the file's tempo, "strikes" when read from them */
  beatFrom: "tempo-map" | "strikes" | null;
};

const round3 = (x: number) => Math.round(x * 1000) / 1000;

function median(sorted: readonly number[]): number {
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/**
 * The commonest interval: the one with the most intervals within 5% (plus 30 ms) of it, as
 * the median of those. Sorted input; two pointers, so linear after the sort.
 */
export function commonestInterval(sortedGaps: readonly number[]): number | null {
  const gaps = sortedGaps.filter((g) => g >= SHORTEST_BEAT_SEC / 2);
  if (gaps.length === 0) return null;
  let lo = 0;
  let hi = 0;
  let best = -1;
  let bestLo = 0;
  let bestHi = 0;
  for (let i = 0; i < gaps.length; i++) {
    const d = gaps[i];
    while (gaps[lo] < d * 0.95 - 0.03) lo++;
    while (hi < gaps.length && gaps[hi] <= d * 1.05 + 0.03) hi++;
    if (hi - lo > best) {
      best = hi - lo;
      bestLo = lo;
      bestHi = hi;
    }
  }
  return median(gaps.slice(bestLo, bestHi));
}

/**
 * How far the intervals lie from the nearest whole or half number of beats, as a share of how
 * far intervals at random would lie (0 on the grid, 1 at two-thirds of chance: ZERO_AT). `beatAtGap(i)`
 * is the beat in force for the i-th interval. A ratio of sums, like smoothness.
 */
function gridSpread(gaps: readonly number[], beatAtGap: (i: number) => number): number {
  let off = 0;
  let chance = 0;
  for (let i = 0; i < gaps.length; i++) {
    const half = beatAtGap(i) / 2;
    const d = gaps[i];
    const nearest = Math.max(1, Math.round(d / half)) * half;
    off += Math.max(0, Math.abs(d - nearest) - UNNOTICED_SEC);
    // An interval at random lies uniformly within a quarter beat of the grid.
    const slack = half / 2 - UNNOTICED_SEC;
    chance += slack > 0 ? (slack * slack) / half : 0;
  }
  return chance > 0 ? off / (ZERO_AT * chance) : 0;
}

/**
 * A beat read from the strikes is a median of a few intervals; over a long interval its error
 * adds up, so it is refined by least squares against the half beats each interval is nearest to.
 */
function fitBeat(gaps: readonly number[], beat: number): number {
  let half = beat / 2;
  for (let round = 0; round < 2; round++) {
    let num = 0;
    let den = 0;
    for (const d of gaps) {
      const n = Math.max(1, Math.round(d / half));
      num += d * n;
      den += n * n;
    }
    if (den > 0 && num > 0) half = num / den;
  }
  return half * 2;
}

/**
 * Rule 22: steady time from the strikes' onsets (seconds, any order) and the file's tempo
 * map. The commonest interval may hold several beats (a chord every two beats), so when the
 * beat is read from the strikes it is that interval or a half, third or quarter of it,
 * whichever the intervals fit best.
 */
export function tempoSteadiness(onsets: readonly number[], tempos: readonly TempoPoint[] = []): BeatSteadiness {
  // Numeric sorts of typed arrays (no comparator calls); repeated onsets counted once.
  const ascending = Float64Array.from(onsets.filter(Number.isFinite)).sort();
  const times: number[] = [];
  for (const t of ascending) if (times.length === 0 || t !== times[times.length - 1]) times.push(t);
  if (times.length < 2) return { medianGapSec: null, spread: null, steadiness: 1, beatSec: null, beatFrom: null };
  const gaps = times.slice(1).map((t, i) => t - times[i]);
  const sortedGaps = Array.from(Float64Array.from(gaps).sort());
  const medianGapSec = round3(median(sortedGaps));

  // Candidates: the beat read from the strikes, and the tempo map's where the strikes follow
  // its grid. The map is taken as rule 22 says, unless its grid is so dense that strikes
  // would follow it by chance (a fast tempo), where it must fit about as well as the strikes.
  let spread = Infinity;
  let beatSec: number | null = null;
  let beatFrom: BeatSteadiness["beatFrom"] = null;
  const common = commonestInterval(sortedGaps);
  if (common !== null) {
    for (let k = 1; k <= 4; k++) {
      if (k > 1 && common / k < SHORTEST_BEAT_SEC) break;
      const beat = fitBeat(gaps, common / k);
      const s = gridSpread(gaps, () => beat);
      // A subdivision of the commonest interval must fit clearly better (a dotted rhythm whose
      // commonest interval is a beat and a half), so that random timing gains little by it.
      if (beatSec === null || s < SUBDIVISION_GAIN * spread) {
        spread = s;
        beatSec = beat;
        beatFrom = "strikes";
      }
    }
  }
  if (followsTempoGrid(times, tempos)) {
    const s = gridSpread(gaps, (i) => 60 / bpmAt(tempos, times[i]));
    const halfBeat = 30 / bpmAt(tempos, times[0]);
    const byChance = Math.min(1, (2 * GRID_TOLERANCE_SEC) / halfBeat);
    if (byChance < 0.5 || s <= spread + MAP_PREFERENCE) {
      spread = s;
      beatSec = 60 / bpmAt(tempos, times[0]);
      beatFrom = "tempo-map";
    }
  }
  if (beatSec === null) return { medianGapSec, spread: null, steadiness: 1, beatSec: null, beatFrom: null };
  return {
    medianGapSec,
    spread: round3(spread),
    steadiness: round3(Math.min(1, Math.max(0, 1 - spread))),
    beatSec: round3(beatSec),
    beatFrom,
  };
}
