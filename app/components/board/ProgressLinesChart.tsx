import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatMetric, weekLabel } from "~/utils/progressFigures";
import type { ChartData } from "~/models/board.server";
import { lineStyle } from "./chartQuery";

/** The chart proper: one line per student, the metric per week. Recharts draws it after hydration. */
export default function ProgressLinesChart({
  data,
  height = 320,
  width,
}: {
  data: ChartData;
  height?: number;
  width?: number;
}) {
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
