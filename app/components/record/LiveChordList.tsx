import { useEffect, useRef } from "react";
import type { ChangeReport, ChordReport } from "~/analysis/types";
import { FLAG_TITLES } from "~/takes/explainFlags";
import type { LiveGrade } from "~/browser/liveGrading";
import { pretty } from "~/utils/noteText";

/** While playing, only the latest chords: a long take must not slow the page down. */
export const LIVE_ROWS = 16;

function symbolOf(c: ChordReport): string {
  return c.symbol ? pretty(c.symbol) : c.noteNames.map(pretty).join(" ");
}

/** "moved 15 · best 3", in the words the take page uses. */
function Motion({ change }: { change: ChangeReport }) {
  if (!change.graded || change.motion === null || change.bestMotion === null)
    return <span className="text-ink-soft">not graded</span>;
  const spare = change.motion - change.bestMotion;
  return (
    <span data-testid="live-change-motion" data-motion={change.motion} data-best={change.bestMotion}>
      moved <strong>{change.motion}</strong> · best <strong>{change.bestMotion}</strong>
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
 * Each chord as it is played: its symbol and Roman numeral, and for every chord after the
 * first the change into it, motion against best motion, with flags. A chord still forming
 * (more notes could join it) is shown at once but greyed until it settles.
 */
export function LiveChordList({ grade, recording }: { grade: LiveGrade | null; recording: boolean }) {
  const list = useRef<HTMLOListElement>(null);
  const count = grade?.chords.length ?? 0;
  useEffect(() => {
    if (recording && list.current) list.current.scrollTop = list.current.scrollHeight;
  }, [count, recording]);

  if (!grade || count === 0) {
    return (
      <p
        className="rounded-md border border-dashed border-line bg-paper px-4 py-6 text-center text-sm text-ink-soft"
        data-testid="live-empty"
      >
        {recording
          ? "Listening… chords appear here as you play them."
          : "Chords and changes appear here while you record."}
      </p>
    );
  }
  const first = recording ? Math.max(0, count - LIVE_ROWS) : 0;
  const changeInto = new Map(grade.changes.map((c) => [c.to, c]));
  return (
    <div>
      <p className="mb-2 text-sm text-ink-soft">
        {count} chord{count === 1 ? "" : "s"} · key {grade.key ? pretty(grade.key) : "–"}
        {grade.keySource === "estimated" ? " (worked out from the notes so far)" : ""}
        {first > 0 ? ` · showing the latest ${LIVE_ROWS}` : ""}
      </p>
      {/* Focusable, so the list scrolls from the keyboard too. */}
      <ol
        ref={list}
        aria-label="Chords as played"
        tabIndex={0}
        className="flex max-h-80 flex-col gap-1.5 overflow-y-auto pr-1"
      >
        {grade.chords.slice(first).map((chord, i) => {
          const k = first + i;
          const settled = k < grade.settled;
          const change = changeInto.get(k);
          const flags = [...(change?.flags ?? []), ...chord.flags];
          return (
            <li
              key={k}
              data-testid="live-chord"
              data-settled={settled ? "yes" : "no"}
              className={`grid grid-cols-[2.5rem_minmax(6rem,auto)_1fr] items-baseline gap-x-3 rounded-md border px-3 py-2 text-sm ${
                settled
                  ? flags.length
                    ? "border-line bg-brick-pale/40"
                    : "border-line bg-card"
                  : "border-dashed border-line bg-paper text-ink-soft"
              }`}
            >
              <span className="text-xs text-ink-soft">{k + 1}</span>
              <span>
                <span className="text-base font-semibold" data-testid="live-chord-symbol">
                  {symbolOf(chord)}
                </span>
                {chord.roman ? <span className="ml-2 text-tide-dark">{pretty(chord.roman)}</span> : null}
              </span>
              <span className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                {change ? (
                  <Motion change={change} />
                ) : (
                  <span className="text-ink-soft">{k === 0 ? "first chord" : ""}</span>
                )}
                {flags.map((f) => (
                  <span
                    key={f}
                    data-testid="live-flag"
                    className="rounded bg-brick px-1.5 py-0.5 text-xs font-semibold text-white"
                  >
                    {FLAG_TITLES[f]}
                  </span>
                ))}
                {settled ? null : <span className="text-xs italic">still listening</span>}
              </span>
            </li>
          );
        })}
      </ol>
    </div>
  );
}
