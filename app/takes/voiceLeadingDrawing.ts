// Geometry of a change drawn as voice leading: each note of the first voicing on the left,
// each note of the second on the right, a line from every note to the note it moves to (the
// joins that give the change's motion, RULES.md rule 7), labelled with its semitones. Pure.
import { voiceLeadingPairs } from "~/analysis/voiceLeading";

export type VoiceLine = { from: number; to: number; semitones: number; y1: number; y2: number; labelY: number };
export type VoiceDrawing = {
  width: number;
  height: number;
  /** x of the left and right note columns */
  left: number;
  right: number;
  fromNotes: Array<{ midi: number; y: number; labelY: number }>;
  toNotes: Array<{ midi: number; y: number; labelY: number }>;
  lines: VoiceLine[];
};

/**
 * Moves label positions apart so no two are closer than `gap`, keeping their order and
 * staying inside [min, max] where room allows: a pass down, then a pass up from the bottom.
 */
export function spreadLabels(ys: readonly number[], gap: number, min = -Infinity, max = Infinity): number[] {
  const order = ys.map((y, i) => ({ y, i })).sort((a, b) => a.y - b.y || a.i - b.i);
  const out = order.map((o) => Math.max(min, o.y));
  for (let k = 1; k < out.length; k++) out[k] = Math.max(out[k], out[k - 1] + gap);
  if (out.length && out[out.length - 1] > max) {
    out[out.length - 1] = max;
    for (let k = out.length - 2; k >= 0; k--) out[k] = Math.min(out[k], out[k + 1] - gap);
  }
  const result = new Array<number>(ys.length);
  order.forEach((o, k) => (result[o.i] = out[k]));
  return result;
}

/** "+2", "−1", "0": a signed move in semitones with a true minus sign. */
export function signedSemitones(n: number): string {
  return n > 0 ? `+${n}` : n < 0 ? `−${-n}` : "0";
}

/**
 * Lay out the change from `from` to `to` (MIDI numbers). `range` fixes the pitch span so the
 * played and suggested drawings of one change share a scale; rows are `rowPx` per semitone.
 */
export function voiceDrawing(
  from: readonly number[],
  to: readonly number[],
  opts: { width?: number; rowPx?: number; range?: { lo: number; hi: number }; labelGap?: number } = {},
): VoiceDrawing {
  const width = opts.width ?? 240;
  const rowPx = opts.rowPx ?? 6;
  const gap = opts.labelGap ?? 14;
  const all = [...from, ...to];
  const lo = opts.range?.lo ?? Math.min(...all);
  const hi = opts.range?.hi ?? Math.max(...all);
  const pad = 14;
  // Tall enough for every label in one column to sit apart.
  const rows = Math.max((hi - lo) * rowPx, (Math.max(from.length, to.length) - 1) * gap);
  const height = rows + 2 * pad;
  const scale = hi === lo ? 0 : rows / (hi - lo);
  const yOf = (m: number) => pad + (hi - m) * scale;
  const left = Math.round(width * 0.3);
  const right = Math.round(width * 0.7);
  const fromSorted = [...new Set(from)].sort((a, b) => a - b);
  const toSorted = [...new Set(to)].sort((a, b) => a - b);
  const column = (notes: number[]) => {
    const ys = notes.map(yOf);
    const labels = spreadLabels(ys, gap, pad / 2, height - pad / 2);
    return notes.map((midi, i) => ({ midi, y: ys[i], labelY: labels[i] }));
  };
  const pairs = from.length && to.length ? voiceLeadingPairs(fromSorted, toSorted) : [];
  const ys = pairs.map(([a, b]) => (yOf(a) + yOf(b)) / 2);
  const labelYs = spreadLabels(ys, gap, pad / 2, height - pad / 2);
  return {
    width,
    height,
    left,
    right,
    fromNotes: column(fromSorted),
    toNotes: column(toSorted),
    lines: pairs.map(([a, b], i) => ({ from: a, to: b, semitones: b - a, y1: yOf(a), y2: yOf(b), labelY: labelYs[i] })),
  };
}
