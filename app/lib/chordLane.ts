// Geometry of the chord lanes under the piano roll: every harmony as wide as it lasts, its
// name and Roman numeral shown only where they fit, and marks (differences from the exercise,
// flags, comments) packed into rows of their own so they never cover a label. Pure.

export type LaneChord = { startSec: number; endSec: number; symbol: string | null; roman: string | null };
export type LaneCell = { index: number; x: number; w: number; showSymbol: boolean; showRoman: boolean };
export type LaneMark = { key: string; x: number; label: string; tone: "mismatch" | "flag" | "comment"; change: number | null };
export type PlacedMark = LaneMark & { w: number; row: number; left: number };

/** Width of a label in the lanes' 12 px font: a little over half the size per character, plus padding. */
export const labelWidth = (text: string, px = 12) => Math.ceil(text.length * px * 0.62) + 8;

/** A harmony shorter than this still gets a visible cell. */
const MIN_CELL = 4;

export function laneCells(chords: readonly LaneChord[], pxPerSec: number): LaneCell[] {
  return chords.map((c, index) => {
    const x = c.startSec * pxPerSec;
    const next = chords[index + 1];
    // A cell runs to the harmony's end, never past the next one's start.
    const end = next ? Math.min(Math.max(c.endSec, c.startSec), next.startSec) : Math.max(c.endSec, c.startSec);
    const w = Math.max(MIN_CELL, (end - c.startSec) * pxPerSec);
    return {
      index,
      x,
      w,
      showSymbol: c.symbol !== null && labelWidth(c.symbol) <= w,
      showRoman: c.roman !== null && labelWidth(c.roman) <= w,
    };
  });
}

/**
 * Marks centred on their x, packed greedily into the first row where they do not touch a
 * mark already there (a gap of 4 px); a mark never leaves the left edge. Returns the rows used.
 */
export function packMarks(marks: readonly LaneMark[]): { placed: PlacedMark[]; rows: number } {
  const rowsEnd: number[] = [];
  const placed = [...marks]
    .sort((a, b) => a.x - b.x)
    .map((m) => {
      const w = labelWidth(m.label);
      const left = Math.max(0, m.x - w / 2);
      let row = rowsEnd.findIndex((end) => end + 4 <= left);
      if (row === -1) {
        row = rowsEnd.length;
        rowsEnd.push(0);
      }
      rowsEnd[row] = left + w;
      return { ...m, w, row, left };
    });
  return { placed, rows: rowsEnd.length };
}

/** Indices of the cells that overlap [left, right] in px (the stretch of the lane in view). */
export function cellsInView(cells: readonly LaneCell[], left: number, right: number): number[] {
  const out: number[] = [];
  let lo = 0;
  let hi = cells.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (cells[mid].x + cells[mid].w < left) lo = mid + 1;
    else hi = mid;
  }
  for (let i = lo; i < cells.length && cells[i].x <= right; i++) out.push(i);
  return out;
}
