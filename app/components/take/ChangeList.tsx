import { useRef } from "react";
import type { Key } from "~/analysis/pitch";
import type { ChangeReport, ChordReport } from "~/analysis/types";
import { explainChange, explainChord, FLAG_TITLES } from "~/lib/explainFlags";
import { pretty } from "~/lib/noteText";
import { stepChange } from "~/lib/pianoRoll";

export function chordName(c: ChordReport | undefined): string {
  if (!c) return "?";
  return c.symbol ? pretty(c.symbol) : c.noteNames.map(pretty).join(" ");
}

/** "moved 15 · best 3", with the spare motion called out when there was any. */
function MotionLine({ change }: { change: ChangeReport }) {
  if (!change.graded || change.motion === null || change.bestMotion === null) {
    return <span className="text-ink-soft">not graded</span>;
  }
  const spare = change.motion - change.bestMotion;
  return (
    <span>
      moved <strong data-testid="change-motion">{change.motion}</strong> · best <strong>{change.bestMotion}</strong>
      {spare > 0 ? <span className="text-ochre"> · {spare} to spare</span> : <span className="text-moss"> · as smooth as it gets</span>}
    </span>
  );
}

/**
 * Every change with its motion, best motion and flags; each flag explained in plain words
 * with the take's numbers. Only the selected button is a tab stop; arrow keys move the
 * selection (the piano roll and the detail panel follow).
 */
export function ChangeList({
  chords,
  changes,
  keyInfo,
  selected,
  onSelect,
}: {
  chords: ChordReport[];
  changes: ChangeReport[];
  keyInfo: Key | null;
  selected: number | null;
  onSelect: (change: number | null) => void;
}) {
  const list = useRef<HTMLOListElement>(null);
  const focusChange = (i: number | null) => {
    onSelect(i);
    if (i !== null) list.current?.querySelector<HTMLButtonElement>(`[data-change="${i}"]`)?.focus();
  };
  const opening = chords[0] ? explainChord(chords[0], keyInfo) : [];

  return (
    <div className="max-h-[34rem] overflow-y-auto pr-1">
      {opening.length ? (
        <div className="mb-2 rounded-md border border-line bg-brick-pale/40 p-3 text-sm">
          <p className="font-semibold">Opening chord, {chordName(chords[0])}</p>
          {opening.map((e) => (
            <p key={e.flag} className="mt-1">
              <strong>{e.title}.</strong> {e.text}
            </p>
          ))}
        </div>
      ) : null}
      <ol ref={list} aria-label="Changes" className="flex flex-col gap-2">
        {changes.map((change, i) => {
          const isSelected = i === selected;
          const explanations = explainChange(change, chords, keyInfo);
          return (
            <li
              key={i}
              data-testid="change-row"
              className={`rounded-md border p-3 text-sm ${isSelected ? "border-ochre bg-ochre-pale" : "border-line bg-card"}`}
            >
              <button
                type="button"
                data-change={i}
                aria-pressed={isSelected}
                tabIndex={isSelected || (selected === null && i === 0) ? 0 : -1}
                onClick={() => onSelect(i)}
                onKeyDown={(e) => {
                  const next = stepChange(selected ?? i, e.key, changes.length);
                  if (next !== (selected ?? i) || e.key === "Home" || e.key === "End") {
                    e.preventDefault();
                    focusChange(next);
                  }
                }}
                className="flex w-full flex-wrap items-baseline justify-between gap-x-4 gap-y-1 text-left"
              >
                <span className="font-semibold">
                  <span className="mr-2 text-xs font-normal text-ink-soft">{i + 1}</span>
                  {chordName(chords[change.from])} → {chordName(chords[change.to])}
                </span>
                <MotionLine change={change} />
              </button>
              {explanations.length ? (
                <ul className="mt-2 flex flex-col gap-1.5 border-t border-line/70 pt-2" aria-label={`Flags on change ${i + 1}`}>
                  {explanations.map((e) => (
                    <li key={e.flag} data-testid="flag-explanation">
                      <span className="mr-1.5 inline-block rounded bg-brick px-1.5 py-0.5 text-xs font-semibold text-white">{FLAG_TITLES[e.flag]}</span>
                      {e.text}
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          );
        })}
      </ol>
    </div>
  );
}
