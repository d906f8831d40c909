import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatMetric, METRIC_IDS, METRICS, weekLabel, type MetricId } from "~/lib/progressFigures";
import type { ChartData } from "~/models/board.server";
import { lineStyle, type ChartChoice } from "./chartQuery";

/** The chart proper: one line per student, the metric per week. Recharts draws it after hydration. */
export function ProgressLines({ data, height = 320, width }: { data: ChartData; height?: number; width?: number }) {
  const rows = data.weeks.map((week, i) => ({
    week: weekLabel(week),
    ...Object.fromEntries(data.series.map((s) => [s.studentId, s.values[i]])),
  }));
  const percent = data.metric === "smoothness" || data.metric === "accuracy";
  const chart = (
    // The keyboard layer is off: the chart sits in an aria-hidden wrapper, and its figures are in the table beside it.
    <LineChart
      data={rows}
      width={width}
      height={height}
      margin={{ top: 8, right: 16, bottom: 8, left: 0 }}
      accessibilityLayer={false}
    >
      <CartesianGrid stroke="#ddd6c8" strokeDasharray="3 3" />
      <XAxis dataKey="week" tick={{ fontSize: 12, fill: "#545b6b" }} />
      <YAxis
        tick={{ fontSize: 12, fill: "#545b6b" }}
        domain={
          percent
            ? [0, 1]
            : data.metric === "score"
              ? [
                  (min: number) => Math.max(0, Math.floor(min / 10) * 10),
                  (max: number) => Math.min(100, Math.ceil(max / 10) * 10),
                ]
              : ["auto", "auto"]
        }
        tickFormatter={(v: number) => (percent ? `${Math.round(v * 100)}%` : String(Math.round(v * 10) / 10))}
      />
      <Tooltip formatter={(v) => formatMetric(data.metric, typeof v === "number" ? v : null)} />
      <Legend />
      {data.series.map((s, i) => {
        const style = lineStyle(i);
        return (
          <Line
            key={s.studentId}
            // Straight segments between weekly values; a week without takes leaves a gap, not a bridge.
            type="linear"
            dataKey={s.studentId}
            name={s.name}
            stroke={style.stroke}
            strokeDasharray={style.dash}
            strokeWidth={2}
            dot={{ r: 2.5 }}
            connectNulls={false}
            isAnimationActive={false}
          />
        );
      })}
    </LineChart>
  );
  return width ? (
    chart
  ) : (
    <ResponsiveContainer width="100%" height={height}>
      {chart}
    </ResponsiveContainer>
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
