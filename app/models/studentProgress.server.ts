// One student's progress over a period, as the teacher's detail page and the
// printable report show it. Everything comes from week sums (take + metric rows).
import { TECHNIQUES, type TechniqueName } from "~/analysis/types";
import { combineSums, EMPTY_SUMS, figuresFrom, weeksBetween } from "~/utils/progressFigures";
import type { ChartData } from "./board.server";
import { exerciseFigures, techniquesGained, weeklySums, type WeekFigures } from "./progress.server";

export function studentProgress(
  studioId: string,
  student: { id: string; name: string },
  fromWeek: string,
  toWeek: string,
) {
  const sums = weeklySums(studioId, { fromWeek, toWeek, studentIds: [student.id] }).get(student.id) ?? new Map();
  const keys = weeksBetween(fromWeek, toWeek);
  const weeks: WeekFigures[] = keys.map((week) => ({ week, ...figuresFrom(sums.get(week) ?? EMPTY_SUMS) }));
  const total = figuresFrom(combineSums([...sums.values()]));
  const weeksUsed = Object.fromEntries(
    TECHNIQUES.map((t) => [t, weeks.filter((w) => w.techniques[t] > 0).length]),
  ) as Record<TechniqueName, number>;
  const series = (metric: "score" | "smoothness"): ChartData => ({
    metric,
    weeks: keys,
    series: [{ studentId: student.id, name: student.name, values: weeks.map((w) => w[metric]) }],
  });
  return {
    weeks,
    total,
    weeksUsed,
    gained: techniquesGained(studioId, student.id, fromWeek, toWeek),
    exercises: exerciseFigures(studioId, student.id, fromWeek, toWeek),
    charts: { score: series("score"), smoothness: series("smoothness") },
  };
}
