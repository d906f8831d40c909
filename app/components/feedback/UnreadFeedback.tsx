import { Link } from "react-router";
import { Card } from "~/components/Card";
import { dayLabel } from "~/utils/plainText";

export type UnreadItem = {
  takeId: string;
  exerciseTitle: string | null;
  recordedAt: string;
  count: number;
  latest: { authorName: string; body: string; changeIdx: number | null };
};

/** The student's home: feedback on their takes they have not read yet. */
export function UnreadFeedback({ items }: { items: UnreadItem[] }) {
  if (items.length === 0) return null;
  const total = items.reduce((n, i) => n + i.count, 0);
  return (
    <Card title={`New feedback (${total})`} data-testid="unread-feedback">
      <ul className="flex flex-col gap-3">
        {items.map((i) => (
          <li key={i.takeId} className="text-sm">
            <Link
              to={`/takes/${i.takeId}${i.latest.changeIdx === null ? "#feedback" : `#change-${i.latest.changeIdx}`}`}
              className="font-semibold text-tide-dark hover:underline"
            >
              {i.exerciseTitle ?? "Free practice"} · {dayLabel(i.recordedAt)}
            </Link>
            <span className="ml-2 rounded bg-ochre-pale px-1.5 text-xs">{i.count} new</span>
            <p className="mt-0.5 line-clamp-2 text-ink-soft">
              {i.latest.authorName}
              {i.latest.changeIdx !== null ? ` on change ${i.latest.changeIdx + 1}` : ""}: {i.latest.body}
            </p>
          </li>
        ))}
      </ul>
    </Card>
  );
}
