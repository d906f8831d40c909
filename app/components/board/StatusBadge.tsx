import type { StatusComparison, StudentStatus } from "~/models/board.server";

export const STATUS_LABELS: Record<StudentStatus, string> = {
  improving: "Improving",
  level: "Holding level",
  slipping: "Slipping",
  stopped: "No takes this week",
  new: "No takes yet",
  early: "Too early to compare",
};

const tones: Record<StudentStatus, string> = {
  improving: "bg-moss-pale text-moss",
  level: "bg-tide-pale text-tide-dark",
  slipping: "bg-ochre-pale text-ochre",
  stopped: "bg-brick-pale text-brick",
  new: "bg-paper text-ink-soft",
  early: "bg-paper text-ink-soft",
};

/** Statuses that rest on the score comparison, and so print its two figures. */
const TREND_STATUSES: StudentStatus[] = ["improving", "level", "slipping"];

/**
 * The status with the two figures it compares printed beside it ("last 3 weeks
 * 78 → 71"), so the badge can be checked against the row at a glance.
 */
export function StatusBadge({ status, compare }: { status: StudentStatus; compare?: StatusComparison }) {
  const trend = compare && TREND_STATUSES.includes(status) && compare.before !== null && compare.recent !== null;
  return (
    <span className="inline-flex flex-col items-start gap-0.5">
      <span
        className={`inline-block whitespace-nowrap rounded-full px-2 py-0.5 text-xs font-semibold ${tones[status]}`}
      >
        {STATUS_LABELS[status]}
      </span>
      {trend ? (
        <span className="whitespace-nowrap text-xs text-ink-soft" data-testid="status-compare">
          <span aria-hidden="true">
            last 3 weeks {compare.before} → {compare.recent}
          </span>
          <span className="sr-only">
            mean score {compare.recent} in the last 3 weeks against {compare.before} in the 3 weeks before
          </span>
        </span>
      ) : null}
    </span>
  );
}
