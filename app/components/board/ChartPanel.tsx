import { useEffect, useState } from "react";
import { useNavigation, useSearchParams } from "react-router";
import { buttonClass } from "~/components/Button";
import { Card } from "~/components/Card";
import { METRIC_IDS, METRICS, shiftWeek, weekOfDate, type MetricId } from "~/utils/progressFigures";
import { weekStart } from "~/utils/weeks";
import { choiceSearch, csvHref, type ChartChoice } from "./chartQuery";
import { chartCaption, ChartTable, ProgressLines, type ChartPayload } from "./ProgressChart";

type Student = { id: string; name: string };

const CHOICE_KEYS = ["metric", "student", "from", "to"];

/**
 * Metric, students and weeks for the comparison chart. The choice lives in the
 * address: each change replaces the search params (no new history entry, no
 * scroll), the board's loader reads them and the chart redraws from its data,
 * so the page can be bookmarked or sent to a co-teacher.
 */
export function ChartPanel({
  students,
  choice: loaded,
  data,
}: {
  students: Student[];
  choice: ChartChoice;
  data: ChartPayload;
}) {
  const [, setSearchParams] = useSearchParams();
  const navigation = useNavigation();
  // What the teacher just picked shows at once; the loader's answer replaces it.
  const [choice, setChoice] = useState(loaded);
  const loadedKey = choiceSearch(loaded);
  useEffect(() => setChoice(loaded), [loadedKey]); // eslint-disable-line react-hooks/exhaustive-deps
  const loading = navigation.state === "loading" && navigation.location.pathname === "/board";

  function update(next: Partial<ChartChoice>) {
    const merged = { ...choice, ...next };
    setChoice(merged);
    setSearchParams(
      (params) => {
        // Other parts of the address (the table's week) stay as they are.
        for (const k of CHOICE_KEYS) params.delete(k);
        for (const [k, v] of new URLSearchParams(choiceSearch(merged))) params.append(k, v);
        return params;
      },
      { replace: true, preventScrollReset: true },
    );
  }

  function lastWeeks(n: number) {
    const toWeek = weekOfDate(choice.to);
    update({ from: weekStart(shiftWeek(toWeek, -(n - 1))) });
  }

  const toggle = (id: string) =>
    update({
      studentIds: choice.studentIds.includes(id)
        ? choice.studentIds.filter((s) => s !== id)
        : [...choice.studentIds, id],
    });
  const caption = chartCaption(data);

  return (
    <Card
      title="Compare students"
      actions={
        <a href={csvHref(choice)} download className={buttonClass("secondary")}>
          Download CSV
        </a>
      }
    >
      <div className="no-print mb-4 grid gap-4 md:grid-cols-[auto_1fr_auto]">
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Metric
          <select
            value={choice.metric}
            onChange={(e) => update({ metric: e.target.value as MetricId })}
            className="rounded-md border border-line bg-white px-3 py-1.5 font-normal"
          >
            {METRIC_IDS.map((m) => (
              <option key={m} value={m}>
                {METRICS[m].label}
              </option>
            ))}
          </select>
        </label>
        <fieldset className="flex flex-col gap-1 text-sm">
          <legend className="font-semibold">Students</legend>
          <div className="flex max-h-28 flex-wrap gap-x-4 gap-y-1 overflow-y-auto">
            {students.map((s) => (
              <label key={s.id} className="inline-flex items-center gap-1.5">
                <input
                  type="checkbox"
                  checked={choice.studentIds.includes(s.id)}
                  // The chart always shows someone: the last ticked student stays ticked.
                  disabled={choice.studentIds.length === 1 && choice.studentIds[0] === s.id}
                  onChange={() => toggle(s.id)}
                />
                {s.name}
              </label>
            ))}
          </div>
        </fieldset>
        <fieldset className="flex flex-col gap-1 text-sm">
          <legend className="font-semibold">Weeks</legend>
          <div className="flex flex-wrap items-center gap-2">
            <label className="sr-only" htmlFor="chart-from">
              From
            </label>
            <input
              id="chart-from"
              type="date"
              value={choice.from}
              max={choice.to}
              onChange={(e) => e.target.value && update({ from: e.target.value })}
              className="rounded-md border border-line bg-white px-2 py-1"
            />
            <span aria-hidden="true">–</span>
            <label className="sr-only" htmlFor="chart-to">
              To
            </label>
            <input
              id="chart-to"
              type="date"
              value={choice.to}
              min={choice.from}
              onChange={(e) => e.target.value && update({ to: e.target.value })}
              className="rounded-md border border-line bg-white px-2 py-1"
            />
          </div>
          <div className="flex gap-2 text-xs">
            {[4, 12, 26, 52].map((n) => (
              <button
                key={n}
                type="button"
                onClick={() => lastWeeks(n)}
                className="rounded border border-line px-2 py-0.5 hover:border-tide"
              >
                {n} weeks
              </button>
            ))}
          </div>
        </fieldset>
      </div>
      <figure
        aria-busy={loading || undefined}
        className={loading ? "opacity-60 transition-opacity" : "transition-opacity"}
      >
        {data.series.length === 0 ? (
          <p className="py-10 text-center text-sm text-ink-soft">Tick at least one student to draw the chart.</p>
        ) : (
          <div aria-hidden="true">
            <ProgressLines data={data} />
          </div>
        )}
        <figcaption data-testid="chart-caption" className="mt-2 text-sm text-ink-soft">
          {caption}
        </figcaption>
        <details className="mt-2">
          <summary className="cursor-pointer text-sm text-tide-dark">Show the chart as a table</summary>
          <ChartTable data={data} caption={caption} />
        </details>
      </figure>
    </Card>
  );
}
