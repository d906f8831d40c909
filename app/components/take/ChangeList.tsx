import { useEffect, useMemo, useRef, useState } from "react";
import type { Key } from "~/analysis/pitch";
import type { ChangeReport, ChordReport } from "~/analysis/types";
import { explainChange, explainChord, FLAG_TITLES } from "~/takes/explainFlags";
import { pretty } from "~/utils/noteText";
import { stepChange } from "~/takes/pianoRoll";

const PAGE = 40;

function pageStartFor(indices: number[], selected: number | null): number {
  const at = selected === null ? -1 : indices.indexOf(selected);
  return at === -1 ? 0 : Math.floor(at / PAGE) * PAGE;
}

/** Long takes list their changes forty at a time, optionally only the flagged ones. */
function Pager({
  start,
  shown,
  total,
  flaggedOnly,
  onFlaggedOnly,
  onPage,
}: {
  start: number;
  shown: number;
  total: number;
  flaggedOnly: boolean;
  onFlaggedOnly: (on: boolean) => void;
  onPage: (start: number) => void;
}) {
  const link =
    "rounded-md border border-line bg-card px-2 py-1 text-sm font-semibold enabled:hover:border-tide disabled:opacity-40";
  return (
    <div className="mb-3 flex flex-wrap items-center justify-between gap-2 text-sm">
      <label className="flex items-center gap-2">
        <input
          type="checkbox"
          checked={flaggedOnly}
          onChange={(e) => onFlaggedOnly(e.target.checked)}
          className="accent-tide"
        />
        Only changes with a flag
      </label>
      <span className="flex items-center gap-2">
        <button type="button" className={link} disabled={start === 0} onClick={() => onPage(Math.max(0, start - PAGE))}>
          ← Earlier
        </button>
        <span className="text-ink-soft" aria-live="polite">
          {total === 0 ? "none" : `${start + 1}–${start + shown} of ${total}`}
        </span>
        <button type="button" className={link} disabled={start + shown >= total} onClick={() => onPage(start + PAGE)}>
          Later →
        </button>
      </span>
    </div>
  );
}

export function chordName(c: ChordReport | undefined): string {
  if (!c) return "?";
  return c.symbol ? pretty(c.symbol) : c.noteNames.length ? c.noteNames.map(pretty).join(" ") : "…";
}

/** "moved 15 · best 3", with the motion beyond the best called out when there was any. */
function MotionLine({ change }: { change: ChangeReport }) {
  if (!change.graded || change.motion === null || change.bestMotion === null) {
    return <span className="text-ink-soft">not graded</span>;
  }
  const spare = change.motion - change.bestMotion;
  return (
    <span>
      moved <strong data-testid="change-motion">{change.motion}</strong> · best <strong>{change.bestMotion}</strong>
      {spare > 0 ? (
        <span className="text-ochre">
          {" "}
          · {spare} semitone{spare === 1 ? "" : "s"} more than needed
        </span>
      ) : (
        <span className="text-moss"> · as smooth as it gets</span>
      )}
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
  commented,
  isLoaded = () => true,
  onNeed,
}: {
  chords: ChordReport[];
  changes: ChangeReport[];
  keyInfo: Key | null;
  selected: number | null;
  onSelect: (change: number | null) => void;
  /** changes that carry a teacher's comment */
  commented?: ReadonlySet<number>;
  /** whether a change's window is here (a long take's changes arrive in windows) */
  isLoaded?: (change: number) => boolean;
  /** asks for the windows of changes shown but not here yet */
  onNeed?: (...changes: number[]) => void;
}) {
  const list = useRef<HTMLOListElement>(null);
  const [flaggedOnly, setFlaggedOnly] = useState(false);
  const indices = useMemo(() => {
    const all = changes.map((_, i) => i);
    return flaggedOnly ? all.filter((i) => changes[i].flags.length > 0 || chords[changes[i].to]?.flags.length) : all;
  }, [changes, chords, flaggedOnly]);
  const [pageStart, setPageStart] = useState(() => pageStartFor(indices, selected));
  // The page follows the selection when the piano roll or the chord strip moves it.
  useEffect(() => {
    const at = selected === null ? -1 : indices.indexOf(selected);
    if (at !== -1) setPageStart((ps) => (at < ps || at >= ps + PAGE ? Math.floor(at / PAGE) * PAGE : ps));
  }, [selected, indices]);
  const start = Math.min(pageStart, Math.max(0, Math.floor((indices.length - 1) / PAGE) * PAGE));
  const page = indices.slice(start, start + PAGE);
  const selectedShown = selected !== null && page.includes(selected);
  const missing = page.filter((i) => !isLoaded(i));
  const missingKey = missing.join(",");
  useEffect(() => {
    if (missing.length) onNeed?.(...missing);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [missingKey, onNeed]);
  const focusChange = (i: number | null) => {
    onSelect(i);
    if (i !== null)
      requestAnimationFrame(() => list.current?.querySelector<HTMLButtonElement>(`[data-change="${i}"]`)?.focus());
  };
  const opening = chords[0]?.notes.length ? explainChord(chords[0], keyInfo) : [];
  // The list is part of the page's one scroll (no scroll box of its own); it pages forty at a time.
  return (
    <div>
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
      {changes.length > PAGE || flaggedOnly ? (
        <Pager
          start={start}
          shown={page.length}
          total={indices.length}
          flaggedOnly={flaggedOnly}
          onFlaggedOnly={(on) => {
            setFlaggedOnly(on);
            setPageStart(0);
          }}
          onPage={setPageStart}
        />
      ) : null}
      <ol ref={list} aria-label="Changes" className="flex flex-col gap-2">
        {page.map((i) => {
          const change = changes[i];
          const isSelected = i === selected;
          const here = isLoaded(i);
          const explanations = here ? explainChange(change, chords, keyInfo) : [];
          return (
            <li
              key={i}
              id={`change-row-${i}`}
              data-testid="change-row"
              className={`rounded-md border p-3 text-sm ${isSelected ? "border-ochre bg-ochre-pale" : "border-line bg-card"}`}
            >
              <button
                type="button"
                data-change={i}
                aria-pressed={isSelected}
                tabIndex={isSelected || (!selectedShown && i === page[0]) ? 0 : -1}
                onClick={() => onSelect(i)}
                onKeyDown={(e) => {
                  // Arrow keys walk the listed changes (all, or only the flagged ones).
                  const at = indices.indexOf(i);
                  const next = stepChange(at, e.key, indices.length);
                  if (next !== null && next !== at) {
                    e.preventDefault();
                    focusChange(indices[next]);
                  }
                }}
                className="flex w-full flex-wrap items-baseline justify-between gap-x-4 gap-y-1 text-left"
              >
                <span className="font-semibold">
                  <span className="mr-2 text-xs font-normal text-ink-soft">{i + 1}</span>
                  {chordName(chords[change.from])} → {chordName(chords[change.to])}
                  {commented?.has(i) ? (
                    <span
                      className="ml-2 inline-block rounded border border-tide bg-tide-pale px-1.5 text-xs font-semibold text-tide-dark"
                      data-testid="comment-mark"
                    >
                      comment
                    </span>
                  ) : null}
                </span>
                {here ? <MotionLine change={change} /> : <span className="text-ink-soft">fetching…</span>}
              </button>
              {explanations.length ? (
                <ul
                  className="mt-2 flex flex-col gap-1.5 border-t border-line/70 pt-2"
                  aria-label={`Flags on change ${i + 1}`}
                >
                  {explanations.map((e) => (
                    <li key={e.flag} data-testid="flag-explanation">
                      <span className="mr-1.5 inline-block rounded bg-brick px-1.5 py-0.5 text-xs font-semibold text-white">
                        {FLAG_TITLES[e.flag]}
                      </span>
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
