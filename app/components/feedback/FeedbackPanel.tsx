import { CommentComposer, CommentThread, type CommentItem } from "./CommentThread";

/** Comments on the take as a whole, with replies; teachers start threads, the student replies. */
export function FeedbackPanel({
  takeId,
  threads,
  canStart,
  canReply,
}: {
  takeId: string;
  threads: CommentItem[];
  canStart: boolean;
  canReply: boolean;
}) {
  const whole = threads.filter((t) => t.changeIdx === null);
  const pinned = threads.filter((t) => t.changeIdx !== null);
  return (
    <div id="feedback" className="flex flex-col gap-4">
      {whole.length === 0 ? (
        <p className="text-sm text-ink-soft">
          {canStart ? "No comments on the whole take yet." : "Your teacher has not commented on the whole take yet."}
        </p>
      ) : (
        <ul className="flex flex-col gap-4">
          {whole.map((t) => (
            <CommentThread key={t.id} takeId={takeId} thread={t} canReply={canReply} />
          ))}
        </ul>
      )}
      {pinned.length ? (
        <p className="text-sm text-ink-soft">
          {pinned.length} comment{pinned.length === 1 ? " is" : "s are"} pinned to changes:{" "}
          {[...new Set(pinned.map((t) => t.changeIdx! + 1))].map((n, i) => (
            <span key={n}>
              {i ? ", " : ""}
              <a href={`#change-${n - 1}`} className="text-tide-dark underline-offset-2 hover:underline">
                change {n}
              </a>
            </span>
          ))}
          . Pick the change to read them beside it.
        </p>
      ) : null}
      {canStart ? (
        <CommentComposer takeId={takeId} label="Comment on the whole take" submitLabel="Post comment" />
      ) : null}
    </div>
  );
}
