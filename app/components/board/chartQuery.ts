// The chart's choice as a query string, shared by the board URL, the chart API and the CSV link.
import type { MetricId } from "~/utils/progressFigures";

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
const LINE_COLOURS = ["#0d6b70", "#9a5b12", "#2f6b3d", "#a3322b", "#1f2430", "#5b3f8c", "#545b6b", "#6f4a0c"];
const LINE_DASHES = [undefined, "6 3", "2 3", "8 3 2 3", "4 4", "10 4", "1 3", "12 3 3 3"];

/**
 * The style of the chart's i-th line: eight colours and eight dash patterns,
 * paired so that the first 64 students never share both.
 */
export function lineStyle(i: number): { stroke: string; dash: string | undefined } {
  return { stroke: LINE_COLOURS[i % 8], dash: LINE_DASHES[(i + Math.floor(i / 8)) % 8] };
}
