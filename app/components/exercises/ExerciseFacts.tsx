import type { TechniqueName } from "~/analysis/types";
import { Card } from "~/components/Card";
import type { ExerciseFormValues } from "./ExerciseForm";
import type { ExpandedKey } from "~/utils/exerciseProgression";
import { dayLabel, pretty } from "~/utils/noteText";
import { TECHNIQUE_WORDS } from "~/takes/takeWords";

type Facts = Pick<
  ExerciseFormValues,
  "progression" | "focusTechniques" | "tempo" | "dueDate" | "instructions" | "assignedTo"
>;

/** What the exercise asks for: target chords in each key, focus techniques, tempo, due date, instructions. */
export function ExerciseFacts({ exercise, expanded }: { exercise: Facts; expanded: ExpandedKey[] }) {
  return (
    <div className="grid items-start gap-6 lg:grid-cols-[3fr_2fr]">
      <Card title="Target progression">
        <p className="mb-3 font-mono text-sm text-ink-soft">{exercise.progression}</p>
        <div className="flex flex-col gap-2" data-testid="exercise-expanded">
          {expanded.map((k) => (
            <div key={k.key} className="flex flex-wrap items-baseline gap-2 text-sm">
              <span className="w-12 shrink-0 font-semibold text-tide-dark">{pretty(k.key)}</span>
              {k.chords.map((c, i) => (
                <span key={i} className="rounded border border-line bg-white px-2 py-0.5">
                  <span className="font-semibold">{pretty(c.symbol)}</span>
                  {c.roman ? <span className="ml-1 text-xs text-ink-soft">{pretty(c.roman)}</span> : null}
                </span>
              ))}
            </div>
          ))}
        </div>
        {exercise.instructions ? <p className="mt-4 whitespace-pre-line text-sm">{exercise.instructions}</p> : null}
      </Card>
      <Card title="Details">
        <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-2 text-sm">
          <dt className="text-ink-soft">Focus</dt>
          <dd>
            {exercise.focusTechniques.length
              ? exercise.focusTechniques.map((t) => TECHNIQUE_WORDS[t as TechniqueName]?.label ?? t).join(", ")
              : "Any"}
          </dd>
          <dt className="text-ink-soft">Tempo</dt>
          <dd>{exercise.tempo ? `${exercise.tempo} bpm` : "Your own"}</dd>
          <dt className="text-ink-soft">Due</dt>
          <dd className="whitespace-nowrap">
            {exercise.dueDate ? dayLabel(`${exercise.dueDate}T12:00:00Z`) : "No date"}
          </dd>
          <dt className="text-ink-soft">Set for</dt>
          <dd>{exercise.assignedTo === "studio" ? "The whole studio" : "Chosen students"}</dd>
        </dl>
      </Card>
    </div>
  );
}
