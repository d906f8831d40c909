import { useEffect, useRef } from "react";
import { useFetcher } from "react-router";
import { failureMessage, failureOf } from "~/forms/failure";
import type { action as feedbackAction } from "~/routes/takes.$takeId.feedback";
import { Button } from "~/components/Button";
import { timeLabel } from "~/utils/noteText";

import type { CommentItem } from "~/models/feedback.server";

export type { CommentItem };

/** Posts a comment or reply to the take's feedback route; errors show beside the box. */
export function CommentComposer({
  takeId,
  changeIdx = null,
  parentId = null,
  label,
  submitLabel,
}: {
  takeId: string;
  changeIdx?: number | null;
  parentId?: string | null;
  label: string;
  submitLabel: string;
}) {
  const fetcher = useFetcher<typeof feedbackAction>();
  const error = failureMessage(failureOf(fetcher.data));
  const form = useRef<HTMLFormElement>(null);
  const wasBusy = useRef(false);
  // Empty the box once the comment is saved (an error leaves the text for another try).
  useEffect(() => {
    if (fetcher.state !== "idle") wasBusy.current = true;
    else if (wasBusy.current) {
      wasBusy.current = false;
      if (!failureOf(fetcher.data)) form.current?.reset();
    }
  }, [fetcher.state, fetcher.data]);
  return (
    <fetcher.Form ref={form} method="post" action={`/takes/${takeId}/feedback`} className="flex flex-col gap-2">
      <input type="hidden" name="intent" value="comment" />
      {changeIdx !== null ? <input type="hidden" name="changeIdx" value={changeIdx} /> : null}
      {parentId ? <input type="hidden" name="parentId" value={parentId} /> : null}
      <label className="flex flex-col gap-1 text-sm">
        <span className="font-semibold">{label}</span>
        <textarea
          name="body"
          rows={2}
          required
          maxLength={4000}
          aria-invalid={error ? true : undefined}
          className="rounded-md border border-line bg-white px-3 py-2 text-base shadow-inner outline-none focus:border-tide"
        />
      </label>
      {error ? (
        <p role="alert" className="text-sm text-brick">
          {error}
        </p>
      ) : null}
      <div>
        <Button variant="secondary" pending={fetcher.state !== "idle"} pendingLabel="Posting…">
          {submitLabel}
        </Button>
      </div>
    </fetcher.Form>
  );
}

function OneComment({ c }: { c: CommentItem }) {
  return (
    <div
      className={`rounded-md border-l-4 px-3 py-2 ${c.unread ? "border-ochre bg-ochre-pale" : "border-tide bg-tide-pale/60"}`}
      data-testid="comment"
    >
      <p className="text-xs text-ink-soft">
        <strong className="text-ink">{c.authorName}</strong> · {timeLabel(c.createdAt)}
        {c.unread ? (
          <span className="ml-2 rounded bg-ochre px-1.5 text-[10px] font-semibold uppercase text-white">new</span>
        ) : null}
      </p>
      <p className="mt-1 whitespace-pre-line text-sm">{c.body}</p>
    </div>
  );
}

/** A comment with its replies, and a reply box for whoever may reply. */
export function CommentThread({
  takeId,
  thread,
  canReply,
}: {
  takeId: string;
  thread: CommentItem;
  canReply: boolean;
}) {
  return (
    <li className="flex flex-col gap-2">
      <OneComment c={thread} />
      {thread.replies.length ? (
        <ul className="ml-6 flex flex-col gap-2">
          {thread.replies.map((r) => (
            <li key={r.id}>
              <OneComment c={r} />
            </li>
          ))}
        </ul>
      ) : null}
      {canReply ? (
        <details className="ml-6">
          <summary className="cursor-pointer text-sm text-tide-dark">Reply</summary>
          <div className="mt-2">
            <CommentComposer takeId={takeId} parentId={thread.id} label="Your reply" submitLabel="Post reply" />
          </div>
        </details>
      ) : null}
    </li>
  );
}
