// The query string the board, its chart API and the CSV export share:
// ?metric=score&student=ID&student=ID&from=YYYY-MM-DD&to=YYYY-MM-DD
import { z } from "zod";
import { METRIC_IDS, shiftWeek, weekOfDate, type MetricId } from "~/utils/progressFigures";
import { localDate, weekStart } from "~/utils/weeks";

/** At most about three years of weeks in one request: enough for any report, small enough to stay quick. */
export const MAX_WEEKS = 160;
export const DEFAULT_WEEKS = 12;

export const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-01-31")
  .refine(
    (s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s),
    "Not a real date",
  );

const schema = z.object({
  metric: z.enum(METRIC_IDS).default("score"),
  student: z.array(z.string().min(1).max(100)).max(200).default([]),
  from: isoDate.optional(),
  to: isoDate.optional(),
});

export type ProgressQuery = {
  metric: MetricId;
  studentIds: string[];
  from: string;
  to: string;
  fromWeek: string;
  toWeek: string;
};

export function todayIn(timeZone: string, now = new Date()): string {
  const d = localDate(now, timeZone);
  return `${d.year}-${String(d.month).padStart(2, "0")}-${String(d.day).padStart(2, "0")}`;
}

/**
 * Parses the query; missing dates default to the last DEFAULT_WEEKS weeks in
 * the studio's calendar. `requireDates` makes from/to mandatory (the CSV export).
 */
export function parseProgressQuery(
  url: URL,
  timeZone: string,
  opts: { requireDates?: boolean; now?: Date } = {},
): { ok: true; query: ProgressQuery } | { ok: false; error: string } {
  const parsed = schema.safeParse({
    metric: url.searchParams.get("metric") || undefined,
    student: url.searchParams.getAll("student").filter(Boolean),
    from: url.searchParams.get("from") || undefined,
    to: url.searchParams.get("to") || undefined,
  });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { ok: false, error: `${issue.path.join(".") || "query"}: ${issue.message}` };
  }
  const { metric, student, from, to } = parsed.data;
  if (opts.requireDates && (!from || !to)) return { ok: false, error: "Give both from and to as YYYY-MM-DD." };
  const toDate = to ?? todayIn(timeZone, opts.now);
  const toWeek = weekOfDate(toDate);
  const fromDate = from ?? weekStart(shiftWeek(toWeek, -(DEFAULT_WEEKS - 1)));
  const fromWeek = weekOfDate(fromDate);
  if (fromDate > toDate) return { ok: false, error: "from must not be after to." };
  if (fromWeek < shiftWeek(toWeek, -(MAX_WEEKS - 1)))
    return { ok: false, error: `At most ${MAX_WEEKS} weeks at a time.` };
  return {
    ok: true,
    query: { metric, studentIds: [...new Set(student)], from: fromDate, to: toDate, fromWeek, toWeek },
  };
}
