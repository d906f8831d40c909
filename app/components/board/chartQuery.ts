// The chart's choice as a query string, shared by the board URL, the chart API and the CSV link.
import type { MetricId } from "~/lib/progressFigures";

export type ChartChoice = { metric: MetricId; studentIds: string[]; from: string; to: string };

export function choiceSearch(c: ChartChoice): string {
  const q = new URLSearchParams({ metric: c.metric, from: c.from, to: c.to });
  for (const id of c.studentIds) q.append("student", id);
  return q.toString();
}

export function csvHref(c: ChartChoice): string {
  const q = new URLSearchParams({ from: c.from, to: c.to });
  for (const id of c.studentIds) q.append("student", id);
  return `/api/export/progress.csv?${q}`;
}

/** Line colours from the palette, each with its own dash so lines differ without colour too. */
export const LINE_STYLES = [
  { stroke: "#0d6b70", dash: undefined },
  { stroke: "#9a5b12", dash: "6 3" },
  { stroke: "#2f6b3d", dash: "2 3" },
  { stroke: "#a3322b", dash: "8 3 2 3" },
  { stroke: "#1f2430", dash: "4 4" },
  { stroke: "#094e52", dash: "10 4" },
  { stroke: "#545b6b", dash: "1 3" },
  { stroke: "#6f4a0c", dash: "12 3 3 3" },
];
