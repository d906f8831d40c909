import { fitSentence, likelySentence, type FitNotice } from "~/takes/exerciseFitText";
import { pretty } from "~/utils/noteText";
import { buttonClass } from "../Button";

/** The id of the hidden form that moves a take to its likely exercise (see MoveToLikelyForm). */
export const moveFormId = (takeId: string) => `move-${takeId}`;

/**
 * A take filed under an exercise it does not fit: what it sounds like, and a one-click move to
 * the exercise it likely belongs to. The button submits a form of its own, placed outside any
 * other form on the page (MoveToLikelyForm), so it also works without JavaScript.
 */
export function ExerciseFitNotice({
  takeId,
  notice,
  canMove,
  busy = false,
}: {
  takeId: string;
  notice: FitNotice;
  canMove: boolean;
  busy?: boolean;
}) {
  const likely = likelySentence(notice);
  return (
    <div
      role="status"
      className="flex flex-col gap-2 rounded-md border-l-4 border-ochre bg-ochre-pale px-4 py-3 text-sm text-ink"
      data-testid="fit-notice"
    >
      <p>
        <span className="font-semibold">Check the exercise.</span> {fitSentence(notice)}
      </p>
      {likely ? (
        <p>{likely}</p>
      ) : canMove ? (
        <p>If it belongs to another exercise, move it under “Manage this take” on its page.</p>
      ) : null}
      {likely && notice.likely && canMove ? (
        <p>
          <button type="submit" form={moveFormId(takeId)} disabled={busy} className={buttonClass("secondary")}>
            Move it to “{notice.likely.title}” in {pretty(notice.likely.key)}
          </button>
        </p>
      ) : null}
    </div>
  );
}

/** The form ExerciseFitNotice's button submits: the take page's own "move" action. */
export function MoveToLikelyForm({ takeId, notice }: { takeId: string; notice: FitNotice }) {
  if (!notice.likely) return null;
  return (
    <form id={moveFormId(takeId)} method="post" action={`/takes/${takeId}`} hidden>
      <input type="hidden" name="intent" value="move" />
      <input type="hidden" name="exerciseId" value={notice.likely.exerciseId} />
      <input type="hidden" name="key" value={notice.likely.key} />
    </form>
  );
}
