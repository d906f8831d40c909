import { useEffect, useRef } from "react";
import type { ChangeReport, ChordReport } from "~/analysis/types";
import { pretty } from "~/lib/noteText";
import { changeForChord } from "~/lib/pianoRoll";
import { inversionWords } from "~/lib/takeWords";

const CELL = 84;
const LINE_H = 46;

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
}: {
  chords: ChordReport[];
  changes: ChangeReport[];
  keyName: string;
  selected: number | null;
  sounding: number | null;
  onSelect: (change: number | null) => void;
}) {
  const scroller = useRef<HTMLDivElement>(null);
  const change = selected !== null ? changes[selected] : undefined;
  const focus = sounding ?? change?.to ?? null;
  useEffect(() => {
    const el = scroller.current;
    if (!el || focus === null) return;
    const x = focus * CELL;
    if (x < el.scrollLeft || x + CELL > el.scrollLeft + el.clientWidth) el.scrollLeft = Math.max(0, x - el.clientWidth / 3);
  }, [focus]);

  const tops = chords.map((c) => c.topNote);
  const lo = Math.min(...tops);
  const hi = Math.max(...tops);
  const yOf = (m: number) => (hi === lo ? LINE_H / 2 : 8 + ((hi - m) / (hi - lo)) * (LINE_H - 16));
  const width = chords.length * CELL;
  const points = chords.map((c, k) => `${k * CELL + CELL / 2},${yOf(c.topNote)}`).join(" ");

  return (
    <div ref={scroller} className="overflow-x-auto">
      <div style={{ width }} className="min-w-full">
        <svg width={width} height={LINE_H} role="img" aria-label={`Top line: ${chords.map((c) => pretty(c.topNoteName)).join(", ")}`}>
          <polyline points={points} className="fill-none stroke-tide" strokeWidth={2} strokeLinejoin="round" />
          {chords.map((c, k) => (
            <circle key={k} cx={k * CELL + CELL / 2} cy={yOf(c.topNote)} r={k === sounding ? 5 : 3.5} className={k === sounding ? "fill-brick" : "fill-tide"} />
          ))}
        </svg>
        <ol aria-label={`Chords, in ${pretty(keyName)}`} className="flex">
          {chords.map((c, k) => {
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
              <li key={k} style={{ width: CELL }} className="shrink-0 px-0.5" data-chord-index={k}>
                <div
                  onClick={() => onSelect(changeForChord(k, changes.length))}
                  className={`flex h-full cursor-pointer flex-col items-center rounded-md border px-1 py-1.5 text-center ${tone}`}
                >
                  <span className="text-base font-semibold leading-tight" data-testid="chord-symbol">
                    {c.symbol ? pretty(c.symbol) : "?"}
                  </span>
                  <span className={`text-sm ${k === sounding ? "text-white" : "text-tide-dark"}`}>{c.roman ? pretty(c.roman) : "–"}</span>
                  <span className={`mt-1 text-[11px] leading-tight ${k === sounding ? "text-white/90" : "text-ink-soft"}`}>
                    {inversionWords(c)}
                    <br />
                    {c.voicing} · top {pretty(c.topNoteName)}
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
