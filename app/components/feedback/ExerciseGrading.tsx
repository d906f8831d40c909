import { Fragment } from "react";
import type { TakeAnalysis, TechniqueName } from "~/analysis/types";
import { placeMismatches } from "~/lib/mismatchPlaces";
import { percent, pretty } from "~/lib/noteText";
import { TECHNIQUE_WORDS } from "~/lib/takeWords";

const KIND_WORDS = { missing: "missing", extra: "extra", "wrong-chord": "wrong chord", "wrong-bass": "wrong bass" } as const;

/**
 * The take against its exercise: accuracy, the played chords in order with each difference at
 * its place (missing chords between the chords they fell between), and how often each focus
 * technique was used.
 */
export function ExerciseGrading({ analysis, focusTechniques }: { analysis: Pick<TakeAnalysis, "chords" | "summary">; focusTechniques: string[] }) {
  const { summary, chords } = analysis;
  if (summary.accuracy === undefined) return null;
  const placed = placeMismatches(analysis);
  const before = (i: number) => placed.filter((p) => p.afterChord === i - 1 && p.onChord === null);
  const on = (i: number) => placed.filter((p) => p.onChord === i);
  const Missing = ({ i }: { i: number }) => (
    <>
      {before(i).map((p, k) => (
        <li key={`m${i}-${k}`} className="flex shrink-0 flex-col items-center justify-center rounded-md border border-dashed border-brick px-2 py-1 text-xs text-brick" data-testid="mismatch-missing">
          <span className="font-semibold">{pretty(p.mismatch.expected ?? "?")}</span>
          <span>missing</span>
        </li>
      ))}
    </>
  );
  return (
    <div className="flex flex-col gap-4">
      <p className="text-sm">
        Accuracy <strong data-testid="grading-accuracy">{percent(summary.accuracy)}</strong> of the target
        {summary.loops && summary.loops > 1 ? ` (played through ${summary.loops} times)` : ""} · {placed.length} difference{placed.length === 1 ? "" : "s"}
      </p>
      <ol className="flex gap-1 overflow-x-auto pb-2" tabIndex={0} aria-label="Played chords with their differences from the exercise">
        {chords.map((c, i) => {
          const here = on(i);
          return (
            <Fragment key={i}>
              <Missing i={i} />
              <li
                className={`flex w-16 shrink-0 flex-col items-center rounded-md border px-1 py-1 text-center text-xs ${here.length ? "border-brick bg-brick-pale" : "border-line bg-white"}`}
                data-testid={here.length ? "mismatch-on-chord" : undefined}
              >
                <span className="text-sm font-semibold">{c.symbol ? pretty(c.symbol) : "?"}</span>
                {here.map((p, k) => (
                  <span key={k} className="text-brick">
                    {KIND_WORDS[p.mismatch.kind]}
                    {p.mismatch.expected && p.mismatch.kind !== "extra" ? ` (${pretty(p.mismatch.expected)})` : ""}
                  </span>
                ))}
              </li>
            </Fragment>
          );
        })}
        <Missing i={chords.length} />
      </ol>
      {focusTechniques.length ? (
        <div>
          <h3 className="text-sm font-semibold">Focus techniques</h3>
          <ul className="mt-1 flex flex-wrap gap-2 text-sm" data-testid="focus-techniques">
            {focusTechniques.map((t) => {
              const n = summary.techniques[t as TechniqueName] ?? 0;
              const words = TECHNIQUE_WORDS[t as TechniqueName]?.label ?? t;
              const text = t === "smooth-top-line" ? (n ? "yes" : "not yet") : `${n} of ${chords.length} chords`;
              return (
                <li key={t} className={`rounded-md border px-2 py-1 ${n ? "border-moss bg-moss-pale" : "border-line bg-white"}`}>
                  {words}: <strong>{text}</strong>
                </li>
              );
            })}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
