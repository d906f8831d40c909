// Geometry of the chord lanes under the piano roll: every harmony as wide as it lasts, its
// name and Roman numeral shown only where they fit, and marks (differences from the exercise,
// flags, comments) packed into rows of their own so they never cover a label. Pure.

export type LaneChord = { startSec: number; endSec: number; symbol: string | null; roman: string | null };
export type LaneCell = { index: number; x: number; w: number; showSymbol: boolean; showRoman: boolean };
export type LaneMark = {
  key: string;
  x: number;
  label: string;
  tone: "mismatch" | "flag" | "comment";
  change: number | null;
};
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

/** Short names for flags in the marks lane (the change list gives the full explanation). */
export const FLAG_MARKS: Record<string, string> = {
  "root-position-leap": "hand jump",
  "top-line-leap": "top leap",
  "pedal-blur": "pedal blur",
  "doubled-bass-third": "doubled 3rd",
  "muddy-low-interval": "low notes close",
  "too-many-notes": "too many notes",
};

type MarkChord = { startSec: number; endSec: number; flags: readonly string[] };
type MarkChange = { from: number; to: number; flags: readonly string[] };
type MarkMismatch = { kind: "missing" | "extra" | "wrong-chord" | "wrong-bass"; expected: string | null };

/**
 * The marks under the roll, each at its time: a difference from the exercise on the chord
 * played (or between two chords for a missing one), a change's flags where the change lands,
 * a chord's flags on the chord, and a teacher's comment on its change.
 */
export function laneMarks(
  chords: readonly MarkChord[],
  changes: readonly MarkChange[],
  placed: ReadonlyArray<{ mismatch: MarkMismatch; onChord: number | null; afterChord: number | null }>,
  commented: ReadonlySet<number>,
  pxPerSec: number,
  pretty: (s: string) => string = (s) => s,
): LaneMark[] {
  const marks: LaneMark[] = [];
  const mid = (k: number) => ((chords[k].startSec + Math.max(chords[k].endSec, chords[k].startSec)) / 2) * pxPerSec;
  const changeTo = (k: number) => (changes.length === 0 ? null : Math.max(0, Math.min(changes.length - 1, k - 1)));
  placed.forEach((p, i) => {
    const expected = p.mismatch.expected ? pretty(p.mismatch.expected) : "";
    if (p.onChord !== null && chords[p.onChord]) {
      const label =
        p.mismatch.kind === "extra"
          ? "extra"
          : p.mismatch.kind === "wrong-bass"
            ? `bass: ${expected}`
            : `want ${expected}`;
      marks.push({ key: `m${i}`, x: mid(p.onChord), label, tone: "mismatch", change: changeTo(p.onChord) });
    } else if (p.afterChord !== null) {
      const next = chords[p.afterChord + 1];
      const last = chords[chords.length - 1];
      const x = (next ? next.startSec : last ? Math.max(last.endSec, last.startSec) : 0) * pxPerSec;
      marks.push({
        key: `m${i}`,
        x,
        label: `${expected} missing`,
        tone: "mismatch",
        change: changeTo(p.afterChord + 1),
      });
    }
  });
  chords.forEach((c, k) => {
    if (c.flags.length)
      marks.push({
        key: `cf${k}`,
        x: mid(k),
        label: c.flags.map((f) => FLAG_MARKS[f] ?? f).join(", "),
        tone: "flag",
        change: changeTo(k),
      });
  });
  changes.forEach((c, i) => {
    const to = chords[c.to];
    if (!to) return;
    if (c.flags.length)
      marks.push({
        key: `xf${i}`,
        x: to.startSec * pxPerSec,
        label: c.flags.map((f) => FLAG_MARKS[f] ?? f).join(", "),
        tone: "flag",
        change: i,
      });
    if (commented.has(i))
      marks.push({ key: `cm${i}`, x: to.startSec * pxPerSec + 1, label: "comment", tone: "comment", change: i });
  });
  return marks;
}
