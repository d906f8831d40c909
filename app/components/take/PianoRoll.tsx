import { useEffect, useMemo, useRef } from "react";
import type { ChangeReport, ChordReport, NoteEvent } from "~/analysis/types";
import { clock, noteLabel, pretty } from "~/lib/noteText";
import { changeForChord, isBlackKey, rollLayout, stepChange, xOf, yOf } from "~/lib/pianoRoll";

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
  const graces = useMemo(() => new Set(chords.flatMap((c) => c.graceNotes.map((g) => graceKey(g.note, g.startSec)))), [chords]);
  const scroller = useRef<HTMLDivElement>(null);
  const change = selected !== null ? changes[selected] : undefined;
  const chordEnd = (k: number) => Math.max(chords[k].endSec, chords[k].startSec + 0.12);

  // Keep the selected change (or the playhead) in view on a long take.
  const focusSec = playTime ?? (change ? chords[change.from]?.startSec : null);
  useEffect(() => {
    const el = scroller.current;
    if (!el || focusSec === null || focusSec === undefined) return;
    const x = xOf(layout, focusSec);
    if (x < el.scrollLeft + 40 || x > el.scrollLeft + el.clientWidth - 120) el.scrollLeft = Math.max(0, x - el.clientWidth / 3);
  }, [focusSec, layout]);

  const rows = [];
  for (let m = layout.lowest; m <= layout.highest; m++) rows.push(m);
  const tickEvery = durationSec > 120 ? 10 : durationSec > 30 ? 5 : 1;
  const ticks = [];
  for (let t = 0; t <= durationSec; t += tickEvery) ticks.push(t);
  const height = layout.height + AXIS_H;

  return (
    <div className="flex overflow-hidden rounded-md border border-line bg-white">
      <svg width={LABEL_W} height={height} aria-hidden="true" className="shrink-0 border-r border-line bg-paper">
        {rows
          .filter((m) => m % 12 === 0)
          .map((m) => (
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
          onKeyDown={(e) => {
            const next = stepChange(selected, e.key, changes.length);
            if (next !== selected) {
              e.preventDefault();
              onSelect(next);
            }
          }}
          className="block outline-offset-[-3px]"
        >
          <g transform={`translate(0 ${AXIS_H})`}>
            {rows.map((m) => (
              <rect key={m} x={0} y={yOf(layout, m)} width={layout.width} height={layout.rowHeight} className={isBlackKey(m) ? "fill-paper" : "fill-white"} />
            ))}
            {rows
              .filter((m) => m % 12 === 0)
              .map((m) => (
                <line key={m} x1={0} x2={layout.width} y1={yOf(layout, m) + layout.rowHeight} y2={yOf(layout, m) + layout.rowHeight} className="stroke-line" />
              ))}
            {chords.map((c, k) => {
              const inChange = change && (k === change.from || k === change.to);
              const tone = k === sounding ? "fill-tide/35 stroke-tide" : inChange ? "fill-ochre-pale stroke-ochre" : "fill-tide-pale";
              const top = yOf(layout, c.notes[c.notes.length - 1]) - 2;
              const bottom = yOf(layout, c.notes[0]) + layout.rowHeight + 2;
              return (
                <rect
                  key={k}
                  data-chord={k}
                  x={xOf(layout, c.startSec) - 2}
                  y={top}
                  width={xOf(layout, chordEnd(k)) - xOf(layout, c.startSec) + 4}
                  height={bottom - top}
                  rx={3}
                  className={`cursor-pointer ${tone}`}
                  strokeWidth={inChange || k === sounding ? 1.5 : 0}
                  onClick={() => onSelect(changeForChord(k, changes.length))}
                >
                  <title>{`${c.symbol ? pretty(c.symbol) : "Unnamed chord"} at ${clock(c.startSec)}`}</title>
                </rect>
              );
            })}
            {notes.map((n, i) => {
              const grace = graces.has(graceKey(n.midi, n.start));
              return (
                <rect
                  key={i}
                  x={xOf(layout, n.start)}
                  y={yOf(layout, n.midi) + 1}
                  width={Math.max(2, xOf(layout, n.end) - xOf(layout, n.start))}
                  height={layout.rowHeight - 2}
                  rx={1.5}
                  className={grace ? "fill-ochre" : "fill-ink/75"}
                  pointerEvents="none"
                />
              );
            })}
            {chords.flatMap((c, k) =>
              c.heldNotes.map((m) => (
                <circle
                  key={`h${k}-${m}`}
                  cx={xOf(layout, c.startSec) + 3}
                  cy={yOf(layout, m) + layout.rowHeight / 2}
                  r={layout.rowHeight / 2 + 1}
                  className="fill-none stroke-moss"
                  strokeWidth={1.5}
                  pointerEvents="none"
                />
              )),
            )}
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
      {item(<circle cx="8" cy="5" r="4" className="fill-none stroke-moss" strokeWidth="1.5" />, "held from an earlier chord")}
    </ul>
  );
}
