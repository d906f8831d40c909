import { CommentComposer, CommentThread, type CommentItem } from "./CommentThread";

/** The comments pinned to one chord change, shown beside that change on the take page. */
export function ChangeComments({
  takeId,
  changeIdx,
  threads,
  canStart,
  canReply,
}: {
  takeId: string;
  changeIdx: number;
  threads: CommentItem[];
  canStart: boolean;
  canReply: boolean;
}) {
  const here = threads.filter((t) => t.changeIdx === changeIdx);
  if (!here.length && !canStart) return null;
  return (
    <section
      id={`change-${changeIdx}`}
      aria-label={`Comments on change ${changeIdx + 1}`}
      className="mt-4 flex flex-col gap-3 border-t border-line pt-3"
      data-testid="change-comments"
    >
      <h3 className="text-sm font-semibold">Comments on change {changeIdx + 1}</h3>
      {here.length ? (
        <ul className="flex flex-col gap-3">
          {here.map((t) => (
            <CommentThread key={t.id} takeId={takeId} thread={t} canReply={canReply} />
          ))}
        </ul>
      ) : null}
      {canStart ? (
        <CommentComposer
          key={changeIdx}
          takeId={takeId}
          changeIdx={changeIdx}
          label={`Comment on change ${changeIdx + 1}`}
          submitLabel="Pin comment here"
        />
      ) : null}
    </section>
  );
}
