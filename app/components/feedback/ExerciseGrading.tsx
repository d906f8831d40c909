import type { TakeAnalysis, TechniqueName } from "~/analysis/types";
import { percent } from "~/utils/noteText";
import { mismatchWords, TECHNIQUE_WORDS } from "~/takes/takeWords";

/**
 * The take against its exercise: accuracy, each difference in words numbered by where it
 * was played (the time line under the roll marks the same places), and how often each
 * focus technique was used.
 */
export function ExerciseGrading({
  analysis,
  focusTechniques,
}: {
  analysis: Pick<TakeAnalysis, "chords" | "summary">;
  focusTechniques: string[];
}) {
  const { summary, chords } = analysis;
  if (summary.accuracy === undefined) return null;
  const mismatches = summary.mismatches ?? [];
  return (
    <div className="flex flex-col gap-4">
      <p className="text-sm">
        Accuracy <strong data-testid="grading-accuracy">{percent(summary.accuracy)}</strong> of the target
        {summary.loops && summary.loops > 1 ? ` (played through ${summary.loops} times)` : ""} · {mismatches.length}{" "}
        difference
        {mismatches.length === 1 ? "" : "s"}
      </p>
      {mismatches.length ? (
        <ol className="list-decimal space-y-1 pl-6 text-sm" data-testid="grading-differences">
          {mismatches.map((m, i) => (
            <li key={i}>{mismatchWords(m, chords, summary.loops ?? 1)}</li>
          ))}
        </ol>
      ) : null}
      {focusTechniques.length ? (
        <div>
          <h3 className="text-sm font-semibold">Focus techniques</h3>
          <ul className="mt-1 flex flex-wrap gap-2 text-sm" data-testid="focus-techniques">
            {focusTechniques.map((t) => {
              const n = summary.techniques[t as TechniqueName] ?? 0;
              const words = TECHNIQUE_WORDS[t as TechniqueName]?.label ?? t;
              const text = t === "smooth-top-line" ? (n ? "yes" : "not yet") : `${n} of ${chords.length} chords`;
              return (
                <li
                  key={t}
                  className={`rounded-md border px-2 py-1 ${n ? "border-moss bg-moss-pale" : "border-line bg-white"}`}
                >
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
