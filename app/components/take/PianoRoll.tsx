import { useEffect, useMemo, useRef, useState } from "react";
import type { ChangeReport, ChordReport, NoteEvent } from "~/analysis/types";
import { cellsInView, laneCells, packMarks, type LaneMark } from "~/takes/chordLane";
import { clock, noteLabel, pretty } from "~/utils/noteText";
import { drawnVoicing } from "~/browser/playbackPlan";
import {
  boxesPath,
  changeForChord,
  chordAtTime,
  isBlackKey,
  rollLayout,
  stepChange,
  xOf,
  yOf,
} from "~/takes/pianoRoll";

const EDGE_W = 44;
const AXIS_H = 18;
const LANE_H = 22;
const MARK_H = 20;
const graceKey = (midi: number, start: number) => `${midi}@${Math.round(start * 1000)}`;

type Props = {
  notes: NoteEvent[];
  chords: ChordReport[];
  changes: ChangeReport[];
  durationSec: number;
  selected: number | null;
  onSelect: (change: number | null) => void;
  /** playback position in seconds, null when not playing */
  playTime: number | null;
  /** index of the chord sounding during playback, null when not playing */
  sounding: number | null;
  /** differences from the exercise, flags and comments, each at its place in time */
  marks: LaneMark[];
  /** draw every change's suggested voicing (while the smoother path plays), not only the selected one */
  ghostAll?: boolean;
  /** lowest and highest key of the whole take, when only some of its notes are here yet */
  range?: [number, number] | null;
  /** told the stretch of time in view (seconds), so the notes there can be fetched */
  onView?: (fromSec: number, toSec: number) => void;
};

// A short take is stretched to fill the card (about 1,000 px wide at the page's widest).
const FILL_WIDTH = 1000;

/**
 * The take drawn as a piano roll with a keyboard edge naming the keys: one bar per key press,
 * chords shaded behind their notes, grace notes in ochre, held notes ringed where a later chord
 * takes them in, the selected change outlined with its suggested voicing as a dashed ghost.
 * Under the roll, aligned in time: a lane of chord names (each as wide as the harmony lasts), a
 * lane of Roman numerals, and rows of marks. The whole take scrolls sideways inside its strip;
 * the arrow keys move between changes.
 */
export function PianoRoll({
  notes,
  chords,
  changes,
  durationSec,
  selected,
  onSelect,
  playTime,
  sounding,
  marks,
  ghostAll = false,
  range = null,
  onView,
}: Props) {
  const layout = useMemo(() => {
    // The whole take's key range keeps the roll's rows steady while windows of notes arrive.
    const edges = range
      ? [
          { midi: range[0], start: 0, end: 0 },
          { midi: range[1], start: 0, end: 0 },
        ]
      : [];
    return rollLayout([...edges, ...notes], durationSec, {
      pxPerSec: Math.max(90, Math.floor(FILL_WIDTH / Math.max(1, durationSec))),
      rowHeight: 12,
    });
  }, [notes, durationSec, range]);
  const cells = useMemo(() => laneCells(chords, layout.pxPerSec), [chords, layout.pxPerSec]);
  const packed = useMemo(() => packMarks(marks), [marks]);
  const drawing = useMemo(() => {
    const graces = new Set(chords.flatMap((c) => c.graceNotes.map((g) => graceKey(g.note, g.startSec))));
    const box = (n: NoteEvent) => ({
      x: xOf(layout, n.start),
      y: yOf(layout, n.midi) + 1,
      w: Math.max(2, xOf(layout, n.end) - xOf(layout, n.start)),
      h: layout.rowHeight - 2,
    });
    const rows: number[] = [];
    for (let m = layout.lowest; m <= layout.highest; m++) rows.push(m);
    return {
      blackRows: boxesPath(
        rows.filter(isBlackKey).map((m) => ({ x: 0, y: yOf(layout, m), w: layout.width, h: layout.rowHeight })),
      ),
      octaveLines: boxesPath(
        rows
          .filter((m) => m % 12 === 0)
          .map((m) => ({ x: 0, y: yOf(layout, m) + layout.rowHeight - 0.5, w: layout.width, h: 1 })),
      ),
      // Chords known only from the time line (their window not here yet) have no notes to shade.
      chords: boxesPath(
        chords
          .filter((c) => c.notes.length > 0)
          .map((c) => {
            const top = yOf(layout, c.notes[c.notes.length - 1]) - 2;
            const end = Math.max(c.endSec, c.startSec + 0.12);
            return {
              x: xOf(layout, c.startSec) - 2,
              y: top,
              w: xOf(layout, end) - xOf(layout, c.startSec) + 4,
              h: yOf(layout, c.notes[0]) + layout.rowHeight + 2 - top,
            };
          }),
      ),
      notes: boxesPath(notes.filter((n) => !graces.has(graceKey(n.midi, n.start))).map(box)),
      graces: boxesPath(notes.filter((n) => graces.has(graceKey(n.midi, n.start))).map(box)),
      // A held note is ringed where a later chord takes it in (a small diamond, one path for all).
      held: chords
        .flatMap((c) =>
          c.heldNotes.map((m) => {
            const x = Math.round(xOf(layout, c.startSec) + 4);
            const y = Math.round(yOf(layout, m) + layout.rowHeight / 2);
            const r = layout.rowHeight / 2 + 1;
            return `M${x - r} ${y}L${x} ${y - r}L${x + r} ${y}L${x} ${y + r}z`;
          }),
        )
        .join(""),
    };
  }, [notes, chords, layout]);

  // The suggested voicing drawn over the change it belongs to: the selected one, or all while the smoother path plays.
  const ghost = useMemo(() => {
    const which = ghostAll ? changes.map((_, i) => i) : selected !== null ? [selected] : [];
    const boxes: Array<{ x: number; y: number; w: number; h: number }> = [];
    for (const i of which) {
      const c = changes[i];
      const to = chords[c?.to];
      const voicing = c ? drawnVoicing(c) : null;
      if (!to || !voicing || voicing.join() === to.notes.join()) continue;
      const x = xOf(layout, to.startSec);
      const w = Math.max(6, xOf(layout, Math.max(to.endSec, to.startSec + 0.12)) - x);
      for (const m of voicing)
        if (m >= layout.lowest && m <= layout.highest)
          boxes.push({ x, y: yOf(layout, m) + 1, w, h: layout.rowHeight - 2 });
    }
    return boxesPath(boxes);
  }, [ghostAll, selected, changes, chords, layout]);

  const highlighted: Array<{ k: number; tone: "selected" | "sounding" }> = [];
  const scroller = useRef<HTMLDivElement>(null);
  const change = selected !== null ? changes[selected] : undefined;
  if (change)
    for (const k of [change.from, change.to]) if (chords[k]?.notes.length) highlighted.push({ k, tone: "selected" });
  if (sounding !== null && chords[sounding]?.notes.length) highlighted.push({ k: sounding, tone: "sounding" });
  const chordEnd = (k: number) => Math.max(chords[k].endSec, chords[k].startSec + 0.12);

  // Only the stretch in view gets its text labels: a 10-minute take has over a thousand chords.
  const [view, setView] = useState({ left: 0, right: FILL_WIDTH + 400 });
  const measure = () => {
    const el = scroller.current;
    if (el) setView({ left: el.scrollLeft - 300, right: el.scrollLeft + el.clientWidth + 300 });
  };
  // The notes of the stretch in view (and a screen either side) are asked for as it scrolls.
  useEffect(() => {
    onView?.(Math.max(0, view.left) / layout.pxPerSec, view.right / layout.pxPerSec);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [view.left, view.right, layout.pxPerSec]);
  // Keep the selected change (or the playhead) in view on a long take.
  const focusSec = playTime ?? (change ? chords[change.from]?.startSec : null);
  useEffect(() => {
    const el = scroller.current;
    if (!el || focusSec === null || focusSec === undefined) return;
    const x = xOf(layout, focusSec);
    if (x < el.scrollLeft + 40 || x > el.scrollLeft + el.clientWidth - 120)
      el.scrollLeft = Math.max(0, x - el.clientWidth / 3);
    measure();
  }, [focusSec, layout]);

  const shownCells = cellsInView(cells, view.left, view.right);
  // Lane cell edges, a thin line where each harmony begins: only in view (a long take has thousands).
  const laneEdges = boxesPath(shownCells.map((k) => ({ x: cells[k].x, y: 0, w: 1, h: 2 * LANE_H })));
  const shownMarks = packed.placed.filter((m) => m.left + m.w >= view.left && m.left <= view.right);
  const rows: number[] = [];
  for (let m = layout.lowest; m <= layout.highest; m++) rows.push(m);
  const tickEvery = durationSec > 120 ? 10 : durationSec > 30 ? 5 : 1;
  const ticks = [];
  for (let t = 0; t <= durationSec; t += tickEvery)
    if (xOf(layout, t) >= view.left - 50 && xOf(layout, t) <= view.right) ticks.push(t);
  const rollBottom = AXIS_H + layout.height;
  const markRows = Math.max(1, packed.rows);
  const height = rollBottom + 2 * LANE_H + markRows * MARK_H + 4;
  const laneY = rollBottom;
  const romanY = rollBottom + LANE_H;
  const marksY = rollBottom + 2 * LANE_H;
  const selectedCells = change ? [change.from, change.to] : [];

  return (
    <div className="flex overflow-hidden rounded-md border border-line bg-white">
      <svg width={EDGE_W} height={height} aria-hidden="true" className="shrink-0 border-r border-line bg-paper">
        {rows.map((m) => {
          const y = AXIS_H + yOf(layout, m);
          const black = isBlackKey(m);
          return (
            <g key={m}>
              <rect
                x={0}
                y={y}
                width={black ? EDGE_W * 0.6 : EDGE_W}
                height={layout.rowHeight}
                className={black ? "fill-ink" : "fill-white stroke-line"}
                strokeWidth={0.5}
              />
              {!black ? (
                <text
                  x={EDGE_W - 3}
                  y={y + layout.rowHeight - 2}
                  textAnchor="end"
                  className={`text-[12px] ${m % 12 === 0 ? "fill-ink font-semibold" : "fill-ink-soft"}`}
                >
                  {m % 12 === 0 ? noteLabel(m, null) : noteLabel(m, null).replace(/-?\d+$/, "")}
                </text>
              ) : null}
            </g>
          );
        })}
        <text x={3} y={laneY + 15} className="fill-ink-soft text-[12px]">
          chord
        </text>
        <text x={3} y={romanY + 15} className="fill-ink-soft text-[12px]">
          in key
        </text>
        {packed.rows > 0 ? (
          <text x={3} y={marksY + 14} className="fill-ink-soft text-[12px]">
            marks
          </text>
        ) : null}
      </svg>
      <div ref={scroller} className="min-w-0 flex-1 overflow-x-auto" onScroll={measure} data-testid="roll-scroller">
        <svg
          width={layout.width}
          height={height}
          tabIndex={0}
          role="group"
          aria-label={`Piano roll, ${chords.length} chords. Use the arrow keys to move from change to change.`}
          onClick={(e) => {
            // One click handler for the whole roll and its lanes: the time under the pointer picks the chord.
            const box = e.currentTarget.getBoundingClientRect();
            const k = chordAtTime(chords, (e.clientX - box.left) / layout.pxPerSec);
            if (k !== null) onSelect(changeForChord(k, changes.length));
          }}
          onKeyDown={(e) => {
            const next = stepChange(selected, e.key, changes.length);
            if (next !== selected) {
              e.preventDefault();
              onSelect(next);
            }
          }}
          className="block cursor-pointer outline-offset-[-3px]"
        >
          <g transform={`translate(0 ${AXIS_H})`}>
            <path d={drawing.blackRows} className="fill-paper" />
            <path d={drawing.octaveLines} className="fill-line" />
            <path d={drawing.chords} className="fill-tide-pale" />
            {highlighted.map(({ k, tone }) => {
              const c = chords[k];
              const top = yOf(layout, c.notes[c.notes.length - 1]) - 2;
              const bottom = yOf(layout, c.notes[0]) + layout.rowHeight + 2;
              return (
                <rect
                  key={`${tone}${k}`}
                  x={xOf(layout, c.startSec) - 2}
                  y={top}
                  width={xOf(layout, chordEnd(k)) - xOf(layout, c.startSec) + 4}
                  height={bottom - top}
                  rx={3}
                  className={tone === "sounding" ? "fill-tide/35 stroke-tide" : "fill-ochre-pale stroke-ochre"}
                  strokeWidth={1.5}
                />
              );
            })}
            <path d={drawing.notes} className="fill-ink/75" />
            <path d={drawing.graces} className="fill-ochre" />
            <path d={drawing.held} className="fill-none stroke-moss" strokeWidth={1.5} />
            <path
              d={ghost}
              className="fill-tide/15 stroke-tide"
              strokeWidth={1.5}
              strokeDasharray="4 3"
              data-testid="ghost-voicing"
            />
            {playTime !== null ? (
              <line
                x1={xOf(layout, playTime)}
                x2={xOf(layout, playTime)}
                y1={0}
                y2={layout.height}
                className="stroke-brick"
                strokeWidth={2}
              />
            ) : null}
          </g>
          {ticks.map((t) => (
            <text key={t} x={xOf(layout, t) + 2} y={13} className="fill-ink-soft text-[12px]">
              {clock(t)}
            </text>
          ))}

          {/* The chord lanes, aligned with the roll above. */}
          <g transform={`translate(0 ${laneY})`}>
            <rect x={0} y={0} width={layout.width} height={2 * LANE_H} className="fill-card" />
            {selectedCells.map((k) =>
              cells[k] ? (
                <rect
                  key={`sel${k}`}
                  x={cells[k].x}
                  y={0}
                  width={cells[k].w}
                  height={2 * LANE_H}
                  className="fill-ochre-pale"
                />
              ) : null,
            )}
            {sounding !== null && cells[sounding] ? (
              <rect
                x={cells[sounding].x}
                y={0}
                width={cells[sounding].w}
                height={2 * LANE_H}
                className="fill-tide/25"
              />
            ) : null}
            <path d={laneEdges} className="fill-line" />
            <line x1={0} x2={layout.width} y1={LANE_H} y2={LANE_H} className="stroke-line" />
            <line x1={0} x2={layout.width} y1={2 * LANE_H} y2={2 * LANE_H} className="stroke-line" />
          </g>
          <g data-testid="chord-lane">
            {shownCells.map((k) => {
              const cell = cells[k];
              const c = chords[k];
              return cell.showSymbol ? (
                <text
                  key={k}
                  x={cell.x + 4}
                  y={laneY + 16}
                  className="fill-ink text-[13px] font-semibold"
                  data-testid="chord-symbol"
                  data-chord-index={k}
                >
                  {pretty(c.symbol!)}
                </text>
              ) : null;
            })}
          </g>
          <g data-testid="roman-lane">
            {shownCells.map((k) => {
              const cell = cells[k];
              const c = chords[k];
              return cell.showRoman ? (
                <text
                  key={k}
                  x={cell.x + 4}
                  y={romanY + 16}
                  className="fill-tide-dark text-[12px]"
                  data-testid="chord-roman"
                >
                  {pretty(c.roman!)}
                </text>
              ) : null;
            })}
          </g>
          <g transform={`translate(0 ${marksY})`}>
            {shownMarks.map((m) => (
              <g key={m.key} transform={`translate(${m.left} ${m.row * MARK_H + 2})`} data-testid={`mark-${m.tone}`}>
                <rect
                  width={m.w}
                  height={MARK_H - 4}
                  rx={3}
                  className={
                    m.tone === "mismatch"
                      ? "fill-brick-pale stroke-brick"
                      : m.tone === "flag"
                        ? "fill-ochre-pale stroke-ochre"
                        : "fill-tide-pale stroke-tide"
                  }
                  strokeWidth={1}
                />
                <text
                  x={4}
                  y={MARK_H - 8}
                  className={`text-[12px] ${m.tone === "mismatch" ? "fill-brick" : m.tone === "flag" ? "fill-ochre" : "fill-tide-dark"}`}
                >
                  {m.label}
                </text>
              </g>
            ))}
          </g>
        </svg>
      </div>
    </div>
  );
}

export function PianoRollLegend() {
  const item = (swatch: React.ReactNode, text: string) => (
    <li className="flex items-center gap-1.5">
      <svg width="16" height="10" aria-hidden="true">
        {swatch}
      </svg>
      {text}
    </li>
  );
  return (
    <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft">
      {item(<rect width="16" height="10" rx="2" className="fill-tide-pale" />, "chord")}
      {item(<rect width="16" height="10" rx="2" className="fill-ochre-pale stroke-ochre" />, "selected change")}
      {item(
        <rect x="1" y="1" width="14" height="8" className="fill-tide/15 stroke-tide" strokeDasharray="3 2" />,
        "suggested voicing",
      )}
      {item(<rect y="2" width="16" height="6" rx="1.5" className="fill-ochre" />, "grace note")}
      {item(
        <path d="M4 5L8 1L12 5L8 9z" className="fill-none stroke-moss" strokeWidth="1.5" />,
        "held from an earlier chord",
      )}
      {item(
        <rect x="1" y="1" width="14" height="8" rx="2" className="fill-brick-pale stroke-brick" />,
        "not as in the exercise",
      )}
      {item(<rect x="1" y="1" width="14" height="8" rx="2" className="fill-ochre-pale stroke-ochre" />, "flag")}
      {item(
        <rect x="1" y="1" width="14" height="8" rx="2" className="fill-tide-pale stroke-tide" />,
        "teacher's comment",
      )}
    </ul>
  );
}
