// Geometry of the piano roll on the take page: which pitches it shows, where a time and a
// pitch land, and how keyboard and clicks move the selected change. Pure, so it is tested
// without a browser and the server renders the same picture the browser hydrates.

export type RollNote = { midi: number; start: number; end: number };

export type RollLayout = {
  lowest: number;
  highest: number;
  rowHeight: number;
  pxPerSec: number;
  width: number;
  height: number;
};

/** Black keys by pitch class (C = 0): C♯ D♯ F♯ G♯ A♯. */
const BLACK = new Set([1, 3, 6, 8, 10]);
export const isBlackKey = (midi: number) => BLACK.has(((midi % 12) + 12) % 12);

/**
 * The rows cover the notes played with two pitches to spare on each side, and at least
 * an octave and a half so a short take of close chords does not look like a bar chart.
 * Width follows the take's length: a 10-minute take is a long strip that scrolls.
 */
export function rollLayout(
  notes: readonly RollNote[],
  durationSec: number,
  opts: { pxPerSec?: number; rowHeight?: number; minRows?: number } = {},
): RollLayout {
  const pxPerSec = opts.pxPerSec ?? 90;
  const rowHeight = opts.rowHeight ?? 8;
  const minRows = opts.minRows ?? 18;
  let lo = Infinity;
  let hi = -Infinity;
  let lastEnd = 0;
  for (const n of notes) {
    if (n.midi < lo) lo = n.midi;
    if (n.midi > hi) hi = n.midi;
    if (n.end > lastEnd) lastEnd = n.end;
  }
  if (!Number.isFinite(lo)) {
    lo = 60;
    hi = 72;
  }
  lo = Math.max(0, lo - 2);
  hi = Math.min(127, hi + 2);
  while (hi - lo + 1 < minRows) {
    if (lo > 0) lo--;
    if (hi - lo + 1 < minRows && hi < 127) hi++;
  }
  const end = Math.max(durationSec, lastEnd, 1);
  return {
    lowest: lo,
    highest: hi,
    rowHeight,
    pxPerSec,
    width: Math.ceil(end * pxPerSec) + 16,
    height: (hi - lo + 1) * rowHeight,
  };
}

export function xOf(layout: RollLayout, sec: number): number {
  return sec * layout.pxPerSec;
}

/** Top edge of a pitch's row; high notes at the top. */
export function yOf(layout: RollLayout, midi: number): number {
  return (layout.highest - midi) * layout.rowHeight;
}

/**
 * A chord selects the change that arrives at it (chord k → change k − 1); the first chord
 * selects the first change. Null when the take has no changes.
 */
export function changeForChord(chordIndex: number, changeCount: number): number | null {
  if (changeCount === 0) return null;
  return Math.min(changeCount - 1, Math.max(0, chordIndex - 1));
}

/** Keyboard movement through the changes, clamped to the ends (Home/End jump there). */
export function stepChange(current: number | null, key: string, changeCount: number): number | null {
  if (changeCount === 0) return null;
  const at = current ?? -1;
  switch (key) {
    case "ArrowRight":
    case "ArrowDown":
      return Math.min(changeCount - 1, at + 1);
    case "ArrowLeft":
    case "ArrowUp":
      return Math.max(0, at === -1 ? 0 : at - 1);
    case "Home":
      return 0;
    case "End":
      return changeCount - 1;
    default:
      return current;
  }
}

const r1 = (x: number) => Math.round(x * 10) / 10;

/**
 * Many same-looking boxes as one SVG path ("M x y h w v h h -w z" each), so a 10-minute take
 * of 5,000 notes is a handful of elements, not thousands: the page renders and hydrates fast.
 */
export function boxesPath(boxes: Iterable<{ x: number; y: number; w: number; h: number }>): string {
  let d = "";
  for (const b of boxes) d += `M${r1(b.x)} ${r1(b.y)}h${r1(b.w)}v${r1(b.h)}h${r1(-b.w)}z`;
  return d;
}

/** Index of the chord whose shaded span contains time t, or null (for clicks on the roll). */
export function chordAtTime(
  chords: ReadonlyArray<{ startSec: number; endSec: number }>,
  t: number,
  slackSec = 0.05,
): number | null {
  let lo = 0;
  let hi = chords.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (chords[mid].startSec - slackSec <= t) lo = mid + 1;
    else hi = mid;
  }
  const k = lo - 1;
  if (k < 0) return null;
  const end = Math.max(chords[k].endSec, chords[k].startSec + 0.12);
  return t <= end + slackSec ? k : null;
}
