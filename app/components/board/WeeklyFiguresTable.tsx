import { formatMetric, weekLabel, type Figures } from "~/utils/progressFigures";

type Week = Figures & { week: string };

const COLUMNS = [
  ["takes", "Takes"],
  ["practiceMinutes", "Minutes"],
  ["changes", "Changes"],
  ["motionPerChange", "Motion / change"],
  ["smoothness", "Smoothness"],
  ["leapsPer10", "Leaps / 10"],
  ["accuracy", "Accuracy"],
  ["score", "Mean score"],
] as const;

/** Every weekly figure, one row a week (newest first), plus the whole period in the footer. */
export function WeeklyFiguresTable({ weeks, total, caption }: { weeks: Week[]; total: Figures; caption: string }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-card print:border-0">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper text-xs uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">
              Week of
            </th>
            {COLUMNS.map(([, label]) => (
              <th key={label} scope="col" className="px-3 py-2 text-right print:px-1">
                {label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-line">
          {[...weeks].reverse().map((w) => (
            <tr key={w.week} className={w.takes === 0 ? "text-ink-soft" : undefined}>
              <th scope="row" className="whitespace-nowrap px-3 py-1.5 font-normal print:px-1">
                {weekLabel(w.week)} <span className="text-xs text-ink-soft print:hidden">{w.week}</span>
              </th>
              {COLUMNS.map(([metric]) => (
                <td key={metric} className="px-3 py-1.5 text-right tabular-nums print:px-1">
                  {formatMetric(metric, w[metric])}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
        <tfoot className="border-t-2 border-line font-semibold">
          <tr>
            <th scope="row" className="px-3 py-2">
              Whole period
            </th>
            {COLUMNS.map(([metric]) => (
              <td key={metric} className="px-3 py-2 text-right tabular-nums">
                {formatMetric(metric, total[metric])}
              </td>
            ))}
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
