import { useFetcher } from "react-router";
import { Button } from "~/components/Button";
import { dayLabel } from "~/utils/noteText";

/** Marking reviewed is an explicit action (opening the take does not do it), with undo. */
export function ReviewToggle({
  takeId,
  review,
}: {
  takeId: string;
  review: { at: string; byName: string | null } | null;
}) {
  const fetcher = useFetcher();
  return (
    <fetcher.Form method="post" action={`/takes/${takeId}/feedback`} className="flex items-center gap-2 text-sm">
      <input type="hidden" name="intent" value={review ? "unreview" : "review"} />
      {review ? (
        <>
          <span className="text-moss" data-testid="review-state">
            Reviewed {dayLabel(review.at)}
            {review.byName ? ` by ${review.byName}` : ""}
          </span>
          <Button variant="quiet" pending={fetcher.state !== "idle"}>
            Undo
          </Button>
        </>
      ) : (
        <Button variant="secondary" pending={fetcher.state !== "idle"}>
          Mark reviewed
        </Button>
      )}
    </fetcher.Form>
  );
}
