import { useEffect, useRef, useState } from "react";
import type { ChangeReport, ChordReport } from "~/analysis/types";
import { pretty } from "~/lib/noteText";
import { changeForChord } from "~/lib/pianoRoll";
import { inversionWords } from "~/lib/takeWords";

const CELL = 96;
const LINE_H = 58;
// Cells drawn beyond the visible ones on each side; a 10-minute take has over a thousand
// chords, so only the visible stretch of the strip is in the page at any time.
const OVERSCAN = 12;
const FIRST_VIEW = 16;

/** Which cells to draw for a scroll position (pure; the first render shows the start). */
export function visibleCells(scrollLeft: number, width: number, count: number): { from: number; to: number } {
  const from = Math.max(0, Math.floor(scrollLeft / CELL) - OVERSCAN);
  const to = Math.min(count, Math.ceil((scrollLeft + width) / CELL) + OVERSCAN);
  return { from, to };
}

/**
 * The chords in order: symbol with its Roman numeral under it, inversion and voicing,
 * and above them the top line drawn as the melody the voicings make.
 */
export function ChordStrip({
  chords,
  changes,
  keyName,
  selected,
  sounding,
  onSelect,
  marks,
}: {
  chords: ChordReport[];
  changes: ChangeReport[];
  keyName: string;
  selected: number | null;
  sounding: number | null;
  onSelect: (change: number | null) => void;
  /** Differences from the exercise by chord index: wrong on the chord, missing just before it. */
  marks?: Record<number, { on: string[]; before: string[] }>;
}) {
  const scroller = useRef<HTMLDivElement>(null);
  const [view, setView] = useState(() => visibleCells(0, FIRST_VIEW * CELL, chords.length));
  const change = selected !== null ? changes[selected] : undefined;
  const focus = sounding ?? change?.to ?? null;
  const measure = () => {
    const el = scroller.current;
    if (el) setView(visibleCells(el.scrollLeft, el.clientWidth, chords.length));
  };
  useEffect(() => {
    const el = scroller.current;
    if (!el) return;
    if (focus !== null) {
      const x = focus * CELL;
      if (x < el.scrollLeft || x + CELL > el.scrollLeft + el.clientWidth) el.scrollLeft = Math.max(0, x - el.clientWidth / 3);
    }
    measure();
  }, [focus, chords.length]);

  const tops = chords.map((c) => c.topNote);
  const lo = Math.min(...tops);
  const hi = Math.max(...tops);
  const yOf = (m: number) => (hi === lo ? LINE_H / 2 : 18 + ((hi - m) / (hi - lo)) * (LINE_H - 26));
  const width = chords.length * CELL;
  const points = chords.map((c, k) => `${k * CELL + CELL / 2},${Math.round(yOf(c.topNote))}`).join(" ");
  const shown: number[] = [];
  for (let k = view.from; k < Math.min(view.to, chords.length); k++) shown.push(k);

  return (
    // The strip scrolls sideways on a long take; as a focusable region the arrow keys scroll it too.
    <div ref={scroller} className="overflow-x-auto pb-2" onScroll={measure} tabIndex={0} role="region" aria-label="Chord strip">
      <div style={{ width }} className="relative min-w-full">
        <svg width={width} height={LINE_H} role="img" aria-label={`Top line of ${chords.length} chords, drawn as a melody`}>
          <polyline points={points} className="fill-none stroke-tide" strokeWidth={2} strokeLinejoin="round" />
          {shown.map((k) => {
            const c = chords[k];
            const x = k * CELL + CELL / 2;
            return (
              <g key={k}>
                <circle cx={x} cy={yOf(c.topNote)} r={k === sounding ? 5 : 3.5} className={k === sounding ? "fill-brick" : "fill-tide"} />
                <text x={x} y={yOf(c.topNote) - 7} textAnchor="middle" className="fill-ink-soft text-[10px]">
                  {pretty(c.topNoteName)}
                </text>
              </g>
            );
          })}
        </svg>
        <ol aria-label={`Chords, in ${pretty(keyName)}`} className="relative h-[5.5rem]">
          {shown.map((k) => {
            const c = chords[k];
            const inChange = change && (k === change.from || k === change.to);
            const tone =
              k === sounding
                ? "border-tide bg-tide text-white"
                : inChange
                  ? "border-ochre bg-ochre-pale"
                  : c.flags.length
                    ? "border-line bg-brick-pale/50"
                    : "border-line bg-card";
            return (
              <li key={k} style={{ width: CELL, left: k * CELL }} className="absolute top-0 h-full px-0.5" data-chord-index={k}>
                {marks?.[k]?.before.length ? (
                  <span className="absolute left-0 top-0 z-10 -translate-x-1/2 -translate-y-1/2 whitespace-nowrap rounded bg-brick px-1 text-[10px] font-semibold text-white" data-testid="strip-missing">
                    {marks![k].before.map((s) => `${pretty(s)} missing`).join(", ")}
                  </span>
                ) : null}
                {k === chords.length - 1 && marks?.[k + 1]?.before.length ? (
                  <span className="absolute right-0 top-0 z-10 translate-x-1/2 -translate-y-1/2 whitespace-nowrap rounded bg-brick px-1 text-[10px] font-semibold text-white" data-testid="strip-missing">
                    {marks[k + 1].before.map((s) => `${pretty(s)} missing`).join(", ")}
                  </span>
                ) : null}
                {marks?.[k]?.on.length ? (
                  <span className="absolute left-1/2 top-0 z-10 -translate-x-1/2 -translate-y-1/2 whitespace-nowrap rounded border border-brick bg-brick-pale px-1 text-[10px] font-semibold text-brick" data-testid="strip-mismatch">
                    {marks[k].on.map(pretty).join(", ")}
                  </span>
                ) : null}
                <div
                  onClick={() => onSelect(changeForChord(k, changes.length))}
                  className={`flex h-full cursor-pointer flex-col items-center justify-center rounded-md border px-1 text-center ${tone}`}
                >
                  <span className="text-base font-semibold leading-tight" data-testid="chord-symbol">
                    {c.symbol ? pretty(c.symbol) : "?"}
                  </span>
                  <span className={`text-sm ${k === sounding ? "text-white" : "text-tide-dark"}`}>{c.roman ? pretty(c.roman) : "–"}</span>
                  <span className={`mt-0.5 text-[11px] leading-tight ${k === sounding ? "text-white/90" : "text-ink-soft"}`}>
                    {inversionWords(c, true)}
                    <br />
                    {c.voicing}
                    {c.detachedBass !== null ? " + bass" : ""}
                  </span>
                </div>
              </li>
            );
          })}
        </ol>
      </div>
    </div>
  );
}
