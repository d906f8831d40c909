import { lazy, Suspense } from "react";
import { formatMetric, METRIC_IDS, METRICS, weekLabel, type MetricId } from "~/utils/progressFigures";
import type { ChartData } from "~/models/board.server";
import type { ChartChoice } from "./chartQuery";

// The chart library is its own chunk, fetched when a chart is drawn.
const ProgressLinesChart = lazy(() => import("./ProgressLinesChart"));

/** The chart proper: one line per student, the metric per week (recharts, loaded on demand). */
export function ProgressLines(props: { data: ChartData; height?: number; width?: number }) {
  return (
    <Suspense fallback={<div style={{ height: props.height ?? 320, width: props.width }} />}>
      <ProgressLinesChart {...props} />
    </Suspense>
  );
}

/** The same numbers as a table, for screen readers and for anyone who prefers figures. */
export function ChartTable({ data, caption, hidden = false }: { data: ChartData; caption: string; hidden?: boolean }) {
  // A visible wide table scrolls, and a scrolling region must take keyboard focus; a screen-reader-only copy does neither.
  return (
    <div
      className={hidden ? "sr-only" : "overflow-x-auto"}
      tabIndex={hidden ? undefined : 0}
      role={hidden ? undefined : "region"}
      aria-label={hidden ? undefined : caption}
    >
      <table className="w-full border-collapse text-left text-sm">
        <caption className="mb-2 text-left text-sm text-ink-soft">{caption}</caption>
        <thead className="bg-paper text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-1.5">
              Week of
            </th>
            {data.series.map((s) => (
              <th key={s.studentId} scope="col" className="px-3 py-1.5">
                {s.name}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-line">
          {data.weeks.map((w, i) => (
            <tr key={w}>
              <th scope="row" className="px-3 py-1 font-normal">
                {weekLabel(w)}
              </th>
              {data.series.map((s) => (
                <td key={s.studentId} className="px-3 py-1">
                  {formatMetric(data.metric, s.values[i])}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** What the chart API answers: the series plus the dates the range was read as. */
export type ChartPayload = ChartData & { from: string; to: string };

export function chartCaption(data: ChartPayload) {
  const n = data.series.length;
  return `${METRICS[data.metric].label} per week, ${n} student${n === 1 ? "" : "s"}, ${data.from} to ${data.to}`;
}

export { METRIC_IDS };
export type { MetricId, ChartChoice };
