import { useEffect, useMemo, useRef } from "react";
import type { ChangeReport, ChordReport, NoteEvent } from "~/analysis/types";
import { clock, noteLabel } from "~/lib/noteText";
import { boxesPath, changeForChord, chordAtTime, isBlackKey, rollLayout, stepChange, xOf, yOf } from "~/lib/pianoRoll";

const LABEL_W = 34;
const AXIS_H = 16;
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
};

// A short take is stretched to fill the card (about 1,040 px wide at the page's widest).
const FILL_WIDTH = 1040;

/**
 * The take drawn as a piano roll: one bar per key press, chords shaded behind their notes,
 * grace notes in ochre, held notes ringed where a later chord takes them in, and the two
 * chords of the selected change outlined. Arrow keys move between changes.
 */
export function PianoRoll({ notes, chords, changes, durationSec, selected, onSelect, playTime, sounding }: Props) {
  const layout = useMemo(
    () => rollLayout(notes, durationSec, { pxPerSec: Math.max(90, Math.floor(FILL_WIDTH / Math.max(1, durationSec))), rowHeight: 10 }),
    [notes, durationSec],
  );
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
      blackRows: boxesPath(rows.filter(isBlackKey).map((m) => ({ x: 0, y: yOf(layout, m), w: layout.width, h: layout.rowHeight }))),
      octaveLines: boxesPath(rows.filter((m) => m % 12 === 0).map((m) => ({ x: 0, y: yOf(layout, m) + layout.rowHeight - 0.5, w: layout.width, h: 1 }))),
      chords: boxesPath(
        chords.map((c) => {
          const top = yOf(layout, c.notes[c.notes.length - 1]) - 2;
          const end = Math.max(c.endSec, c.startSec + 0.12);
          return { x: xOf(layout, c.startSec) - 2, y: top, w: xOf(layout, end) - xOf(layout, c.startSec) + 4, h: yOf(layout, c.notes[0]) + layout.rowHeight + 2 - top };
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
  const highlighted: Array<{ k: number; tone: "selected" | "sounding" }> = [];
  const scroller = useRef<HTMLDivElement>(null);
  const change = selected !== null ? changes[selected] : undefined;
  if (change) highlighted.push({ k: change.from, tone: "selected" }, { k: change.to, tone: "selected" });
  if (sounding !== null && chords[sounding]) highlighted.push({ k: sounding, tone: "sounding" });
  const chordEnd = (k: number) => Math.max(chords[k].endSec, chords[k].startSec + 0.12);

  // Keep the selected change (or the playhead) in view on a long take.
  const focusSec = playTime ?? (change ? chords[change.from]?.startSec : null);
  useEffect(() => {
    const el = scroller.current;
    if (!el || focusSec === null || focusSec === undefined) return;
    const x = xOf(layout, focusSec);
    if (x < el.scrollLeft + 40 || x > el.scrollLeft + el.clientWidth - 120) el.scrollLeft = Math.max(0, x - el.clientWidth / 3);
  }, [focusSec, layout]);

  const octaves: number[] = [];
  for (let m = layout.lowest; m <= layout.highest; m++) if (m % 12 === 0) octaves.push(m);
  const tickEvery = durationSec > 120 ? 10 : durationSec > 30 ? 5 : 1;
  const ticks = [];
  for (let t = 0; t <= durationSec; t += tickEvery) ticks.push(t);
  const height = layout.height + AXIS_H;

  return (
    <div className="flex overflow-hidden rounded-md border border-line bg-white">
      <svg width={LABEL_W} height={height} aria-hidden="true" className="shrink-0 border-r border-line bg-paper">
        {octaves.map((m) => (
            <text key={m} x={LABEL_W - 4} y={AXIS_H + yOf(layout, m) + layout.rowHeight - 1} textAnchor="end" className="fill-ink-soft text-[9px]">
              {noteLabel(m, null)}
            </text>
          ))}
      </svg>
      <div ref={scroller} className="overflow-x-auto">
        <svg
          width={layout.width}
          height={height}
          tabIndex={0}
          role="group"
          aria-label={`Piano roll, ${chords.length} chords. Use the arrow keys to move from change to change.`}
          onClick={(e) => {
            // One click handler for the whole roll: the time under the pointer picks the chord.
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
            {playTime !== null ? (
              <line x1={xOf(layout, playTime)} x2={xOf(layout, playTime)} y1={0} y2={layout.height} className="stroke-brick" strokeWidth={2} />
            ) : null}
          </g>
          {ticks.map((t) => (
            <text key={t} x={xOf(layout, t) + 2} y={11} className="fill-ink-soft text-[9px]">
              {clock(t)}
            </text>
          ))}
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
      {item(<rect y="2" width="16" height="6" rx="1.5" className="fill-ochre" />, "grace note")}
      {item(<path d="M4 5L8 1L12 5L8 9z" className="fill-none stroke-moss" strokeWidth="1.5" />, "held from an earlier chord")}
    </ul>
  );
}
