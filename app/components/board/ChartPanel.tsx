import { useMemo, useState } from "react";
import { buttonClass } from "~/components/Button";
import { Card } from "~/components/Card";
import { FlashMessage } from "~/components/FlashMessage";
import { METRIC_IDS, METRICS, shiftWeek, weekOfDate, type MetricId } from "~/lib/progressFigures";
import { weekStart } from "~/lib/weeks";
import { choiceSearch, csvHref, type ChartChoice } from "./chartQuery";
import { chartCaption, ChartTable, ProgressLines, useChartData, type ChartPayload } from "./ProgressChart";

type Student = { id: string; name: string };

/**
 * Metric, students and weeks for the comparison chart. Each change fetches JSON
 * and redraws in place; the address bar keeps the choice (replaceState, no
 * navigation) so the page can be bookmarked or sent to a co-teacher.
 */
export function ChartPanel({ students, initialChoice, initialData }: { students: Student[]; initialChoice: ChartChoice; initialData: ChartPayload }) {
  const [choice, setChoice] = useState(initialChoice);
  const search = useMemo(() => choiceSearch(choice), [choice]);
  const { data, loading, error } = useChartData(initialData, choice.studentIds.length ? search : null);

  function update(next: Partial<ChartChoice>) {
    const merged = { ...choice, ...next };
    setChoice(merged);
    // Other parts of the address (the table's week) stay as they are.
    const params = new URLSearchParams(window.location.search);
    for (const k of ["metric", "student", "from", "to"]) params.delete(k);
    for (const [k, v] of new URLSearchParams(choiceSearch(merged))) params.append(k, v);
    const url = `${window.location.pathname}?${params}`;
    // Keep React Router's own history entry state; only the address changes.
    window.history.replaceState(window.history.state, "", url);
  }

  function lastWeeks(n: number) {
    const toWeek = weekOfDate(choice.to);
    update({ from: weekStart(shiftWeek(toWeek, -(n - 1))) });
  }

  const toggle = (id: string) =>
    update({ studentIds: choice.studentIds.includes(id) ? choice.studentIds.filter((s) => s !== id) : [...choice.studentIds, id] });
  const caption = chartCaption(data);

  return (
    <Card title="Compare students" actions={<a href={csvHref(choice)} download className={buttonClass("secondary")}>Download CSV</a>}>
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
                <input type="checkbox" checked={choice.studentIds.includes(s.id)} onChange={() => toggle(s.id)} />
                {s.name}
              </label>
            ))}
          </div>
        </fieldset>
        <fieldset className="flex flex-col gap-1 text-sm">
          <legend className="font-semibold">Weeks</legend>
          <div className="flex flex-wrap items-center gap-2">
            <label className="sr-only" htmlFor="chart-from">From</label>
            <input id="chart-from" type="date" value={choice.from} max={choice.to} onChange={(e) => e.target.value && update({ from: e.target.value })} className="rounded-md border border-line bg-white px-2 py-1" />
            <span aria-hidden="true">–</span>
            <label className="sr-only" htmlFor="chart-to">To</label>
            <input id="chart-to" type="date" value={choice.to} min={choice.from} onChange={(e) => e.target.value && update({ to: e.target.value })} className="rounded-md border border-line bg-white px-2 py-1" />
          </div>
          <div className="flex gap-2 text-xs">
            {[4, 12, 26, 52].map((n) => (
              <button key={n} type="button" onClick={() => lastWeeks(n)} className="rounded border border-line px-2 py-0.5 hover:border-tide">
                {n} weeks
              </button>
            ))}
          </div>
        </fieldset>
      </div>
      {error ? <FlashMessage tone="error">{error}</FlashMessage> : null}
      <figure aria-busy={loading || undefined} className={loading ? "opacity-60 transition-opacity" : "transition-opacity"}>
        {choice.studentIds.length === 0 ? (
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
