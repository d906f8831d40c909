import { lazy, Suspense, useEffect, useState } from "react";
import { Link } from "react-router";
import { Card } from "~/components/Card";
import { dayLabel } from "~/utils/plainText";
import { weekStart } from "~/utils/weeks";

// The chart library is fetched only when a chart is drawn, not with the page.
const WeeklyLines = lazy(() => import("./WeeklyLines"));

export type WeekFigures = { week: string; takes: number; smoothness: number | null; score: number | null };

/** "Week of 23 Nov 2026" from "2026-W48". */
export function weekLabel(key: string): string {
  try {
    return `Week of ${dayLabel(`${weekStart(key)}T00:00:00Z`)}`;
  } catch {
    return key;
  }
}

const shortWeek = (key: string) =>
  weekLabel(key)
    .replace(/^Week of /, "")
    .replace(/ \d{4}$/, "");

/**
 * Smoothness and score by week, both on a 0–100 scale. Recharts draws in the browser
 * only, so the same figures are always there as a table too (and the chart waits for
 * hydration instead of rendering an empty frame on the server); its code loads then.
 */
export function WeeklyChart({ weeks }: { weeks: WeekFigures[] }) {
  const [mounted, setMounted] = useState(false);
  useEffect(() => setMounted(true), []);
  const points = weeks.map((w) => ({
    week: shortWeek(w.week),
    smoothness: w.smoothness === null ? null : Math.round(w.smoothness * 100),
    score: w.score === null ? null : Math.round(w.score),
  }));
  const last = points[points.length - 1];
  const summary = last
    ? `${weeks.length} week${weeks.length === 1 ? "" : "s"} of practice; latest week: smoothness ${last.smoothness ?? "–"}%, average score ${last.score ?? "–"}.`
    : "No analysed takes yet.";
  return (
    <div className="flex flex-col gap-3">
      <div className="h-64 w-full" role="img" aria-label={`Chart of smoothness and score by week. ${summary}`}>
        {mounted ? (
          <Suspense
            fallback={<p className="flex h-full items-center justify-center text-sm text-ink-soft">{summary}</p>}
          >
            <WeeklyLines points={points} />
          </Suspense>
        ) : (
          <p className="flex h-full items-center justify-center text-sm text-ink-soft">{summary}</p>
        )}
      </div>
      <details className="text-sm">
        <summary className="cursor-pointer text-tide-dark">Show the figures as a table</summary>
        <table className="mt-2 w-full text-left">
          <caption className="sr-only">Smoothness and score by week</caption>
          <thead className="text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className="py-1">
                Week
              </th>
              <th scope="col" className="py-1 text-right">
                Takes
              </th>
              <th scope="col" className="py-1 text-right">
                Smoothness
              </th>
              <th scope="col" className="py-1 text-right">
                Average score
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {weeks.map((w, i) => (
              <tr key={w.week}>
                <th scope="row" className="py-1 font-normal">
                  {weekLabel(w.week)}
                </th>
                <td className="py-1 text-right tabular-nums">{w.takes}</td>
                <td className="py-1 text-right tabular-nums">{points[i].smoothness ?? "–"}%</td>
                <td className="py-1 text-right tabular-nums">{points[i].score ?? "–"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </div>
  );
}

/** The student's week-by-week card: the chart and its table, or a word on what will appear there. */
export function WeekByWeek({ weeks }: { weeks: WeekFigures[] }) {
  return (
    <Card title="Week by week">
      {weeks.length === 0 ? (
        <p className="text-sm text-ink-soft">Your smoothness and score appear here by week once a take is analysed.</p>
      ) : (
        <WeeklyChart weeks={weeks} />
      )}
      <p className="mt-3 text-xs text-ink-soft">
        Smoothness is the motion you could have had over the motion you played, summed over the week.{" "}
        <Link to="/privacy" className="underline">
          What Nearnote keeps
        </Link>
      </p>
    </Card>
  );
}
