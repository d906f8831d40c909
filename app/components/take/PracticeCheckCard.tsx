import { Form, useNavigation } from "react-router";
import type { TakeAnalysis } from "~/analysis/types";
import { ExerciseGrading } from "~/components/feedback/ExerciseGrading";
import type { PracticeCheck } from "~/takes/practiceCheck";
import { percent, pretty } from "~/utils/noteText";
import { Button } from "../Button";
import { Card } from "../Card";
import { ALL_KEYS } from "./ExerciseKeyFields";

const keyWords = (name: string) =>
  name.endsWith("m") ? `${pretty(name.slice(0, -1))} minor` : `${pretty(name)} major`;

/**
 * A take without an exercise has no target: the card says so, names the key it is heard in
 * and the open exercise it likely is (with a button that files it there, for its student), and
 * checks it against any progression a person names. The check is a GET form (`against`, `in`),
 * so it works without scripts and its address can be shared; nothing of it is stored.
 */
export function PracticeCheckCard({
  takeId,
  check,
  analysis,
  isOwner,
  studentFirstName,
}: {
  takeId: string;
  check: PracticeCheck & { key: string };
  analysis: Pick<TakeAnalysis, "chords" | "summary">;
  isOwner: boolean;
  studentFirstName: string;
}) {
  const navigation = useNavigation();
  const keys = ALL_KEYS.includes(check.key) ? ALL_KEYS : [check.key, ...ALL_KEYS];
  const asked = check.asked;
  const whose = isOwner ? "your" : `${studentFirstName}’s`;
  return (
    <Card title="Against a progression" id="check" data-testid="practice-check">
      <div className="flex flex-col gap-4 text-sm">
        <p>
          <span className="font-semibold">Free practice: no exercise sets a target for this take</span>, so it has no
          accuracy and its score leaves accuracy out.
          {check.heardKey ? (
            <>
              {" "}
              It sounds like <strong data-testid="practice-heard-key">{keyWords(check.heardKey)}</strong>.
            </>
          ) : null}
        </p>
        {check.likely ? (
          <div className="flex flex-col gap-2 rounded-md border-l-4 border-tide bg-tide-pale px-4 py-3">
            <p data-testid="practice-likely">
              It plays {percent(check.likely.accuracy)} of the chords of “{check.likely.title}” in{" "}
              {keyWords(check.likely.key)}, one of {whose} exercises.
            </p>
            {isOwner ? (
              <Form method="post" action={`/takes/${takeId}`}>
                <input type="hidden" name="exerciseId" value={check.likely.exerciseId} />
                <input type="hidden" name="key" value={check.likely.key} />
                <Button
                  name="intent"
                  value="move"
                  variant="secondary"
                  pending={navigation.formData?.get("intent") === "move"}
                  pendingLabel="Filing…"
                >
                  File it under “{check.likely.title}”
                </Button>
              </Form>
            ) : null}
          </div>
        ) : check.compared > 0 ? (
          <p data-testid="practice-likely">It does not follow the progression of any of {whose} open exercises.</p>
        ) : null}

        <Form method="get" preventScrollReset className="flex flex-col gap-3" aria-label="Check against a progression">
          <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_auto] sm:items-end">
            <div className="flex min-w-0 flex-col gap-1">
              <label htmlFor={`${takeId}-against`} className="font-semibold">
                Progression
              </label>
              <input
                id={`${takeId}-against`}
                name="against"
                defaultValue={asked?.target ?? ""}
                maxLength={300}
                placeholder="I IV V I, or D G A D"
                aria-describedby={`${takeId}-against-hint`}
                className="w-full min-w-0 rounded-md border border-line bg-white px-3 py-2 text-base text-ink shadow-inner focus:border-tide"
              />
            </div>
            <div className="flex min-w-0 flex-col gap-1">
              <label htmlFor={`${takeId}-in`} className="font-semibold">
                Key
              </label>
              <select
                id={`${takeId}-in`}
                name="in"
                defaultValue={check.key}
                className="w-full min-w-0 rounded-md border border-line bg-white px-3 py-2 text-base text-ink shadow-inner focus:border-tide"
              >
                {keys.map((k) => (
                  <option key={k} value={k}>
                    {keyWords(k)}
                  </option>
                ))}
              </select>
            </div>
            <Button variant="secondary" pending={navigation.formMethod === "GET" && navigation.state === "loading"}>
              Check
            </Button>
          </div>
          <p id={`${takeId}-against-hint`} className="text-ink-soft">
            Roman numerals or chord symbols, as an exercise is written. The check is not saved and leaves the score as
            it is.
          </p>
        </Form>

        {asked?.error !== undefined && asked ? (
          <p role="alert" className="text-brick" data-testid="practice-error">
            “{asked.target}” could not be read: {asked.error}.
          </p>
        ) : asked ? (
          <section aria-label="Result of the check" className="flex flex-col gap-2 border-t border-line pt-3">
            <h3 className="font-semibold">
              Against {asked.target} in {keyWords(asked.key)}
            </h3>
            <ExerciseGrading
              analysis={{
                chords: analysis.chords,
                summary: {
                  ...analysis.summary,
                  accuracy: asked.accuracy,
                  loops: asked.loops,
                  mismatches: asked.mismatches,
                },
              }}
              focusTechniques={[]}
            />
            {isOwner ? (
              <p className="text-ink-soft">To have it graded against an exercise, file it under Manage this take.</p>
            ) : null}
          </section>
        ) : null}
      </div>
    </Card>
  );
}
