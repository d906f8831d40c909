import type { ReactNode } from "react";
import { Form, Link } from "react-router";
import { Pager } from "~/components/Pager";
import { TECHNIQUES } from "~/analysis/types";
import { TECHNIQUE_WORDS } from "~/takes/takeWords";
import { METRICS, type MetricId } from "~/utils/progressFigures";
import type { BoardRow } from "~/models/board.server";
import type { BoardSort, BoardTable as BoardTableData } from "~/models/boardTable.server";
import { Delta } from "./Delta";
import { Sparkline } from "./Sparkline";
import { STATUS_LABELS, StatusBadge } from "./StatusBadge";

/** Short tags for the techniques column; the full name is the tooltip and what screen readers get. */
const TECHNIQUE_SHORT: Record<(typeof TECHNIQUES)[number], string> = {
  "added-second": "add2",
  inversion: "inv",
  "open-voicing": "open",
  "slash-bass": "bass",
  "grace-to-third": "grace",
  "smooth-top-line": "top",
};

type Column = { id: BoardSort | "trend"; header: string; cell: (r: BoardRow) => ReactNode };

/** A this-week metric with its change since last week. */
function metricColumn(metric: MetricId & BoardSort): Column {
  return {
    id: metric,
    header: METRICS[metric].short,
    cell: (r) => <Delta metric={metric} now={r.thisWeek[metric]} before={r.lastWeek[metric]} />,
  };
}

/** The board's columns; dates print in the studio's calendar. */
function boardColumns(timeZone: string): Column[] {
  return [
    {
      id: "name",
      header: "Student",
      cell: (r) => (
        <span className="inline-flex flex-col">
          <Link
            to={`/students/${r.studentId}`}
            className="whitespace-nowrap font-semibold text-tide-dark hover:underline"
          >
            {r.name}
          </Link>
          <Link
            to={`/reports/${r.studentId}`}
            className="text-xs text-tide-dark underline-offset-2 hover:underline"
            aria-label={`Report for ${r.name}`}
          >
            Report
          </Link>
        </span>
      ),
    },
    { id: "status", header: "Status", cell: (r) => <StatusBadge status={r.status} compare={r.compare} /> },
    metricColumn("takes"),
    metricColumn("practiceMinutes"),
    metricColumn("score"),
    metricColumn("smoothness"),
    metricColumn("motionPerChange"),
    metricColumn("leapsPer10"),
    metricColumn("accuracy"),
    {
      id: "techniques",
      header: "Techniques",
      cell: (r) => {
        const used = TECHNIQUES.filter((t) => r.thisWeek.techniques[t] > 0);
        if (!used.length) return "–";
        return (
          <span className="inline-flex flex-wrap gap-1">
            {used.map((t) => (
              <span
                key={t}
                title={TECHNIQUE_WORDS[t].label}
                className="rounded bg-tide-pale px-1 text-xs text-tide-dark"
              >
                <span aria-hidden="true">{TECHNIQUE_SHORT[t]}</span>
                <span className="sr-only">{TECHNIQUE_WORDS[t].label}</span>
              </span>
            ))}
          </span>
        );
      },
    },
    {
      id: "lastTake",
      header: "Last take",
      cell: (r) =>
        r.lastTakeAt ? (
          <time dateTime={r.lastTakeAt} className="whitespace-nowrap">
            {shortDate(r.lastTakeAt, timeZone)}
          </time>
        ) : (
          "never"
        ),
    },
    {
      id: "trend",
      header: "Trend",
      cell: (r) => <Sparkline width={60} values={r.trend} label={`${r.name}'s mean score over 8 weeks`} />,
    },
  ];
}

/** Column names for the phone layout, where each row is a card and each cell says what it is. */
const CELL_LABELS: Record<string, string> = {
  name: "",
  status: "Status",
  ...Object.fromEntries(Object.entries(METRICS).map(([id, m]) => [id, m.short])),
  techniques: "Techniques",
  lastTake: "Last take",
  trend: "Trend",
};

/** "2 Dec" in the studio's calendar. */
function shortDate(iso: string, timeZone: string) {
  return new Date(iso).toLocaleDateString("en-GB", { day: "numeric", month: "short", timeZone });
}

/**
 * The board's students a page at a time, filtered and sorted on the server: the filters are
 * a GET form and each sortable header a link, so all of it works without scripts.
 */
export function BoardTable({ table, timeZone }: { table: BoardTableData; timeZone: string }) {
  const columns = boardColumns(timeZone);
  const { query, rows } = table;
  const first = (query.page - 1) * table.pageSize + 1;
  return (
    <div className="flex flex-col gap-3" id="students">
      <Form
        method="get"
        className="no-print flex flex-wrap items-end gap-4"
        role="search"
        aria-label="Filter students"
        preventScrollReset
      >
        {table.keep.map(([name, value], i) => (
          <input key={`${name}-${i}`} type="hidden" name={name} value={value} />
        ))}
        {query.sort !== "name" || query.dir !== "asc" ? (
          <>
            <input type="hidden" name="sort" value={query.sort} />
            <input type="hidden" name="dir" value={query.dir} />
          </>
        ) : null}
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Name
          <input
            type="search"
            name="name"
            defaultValue={query.name}
            key={query.name}
            placeholder="Part of a name"
            className="rounded-md border border-line bg-white px-3 py-1.5 font-normal"
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Status
          <select
            name="status"
            defaultValue={query.status ?? ""}
            key={query.status ?? ""}
            className="rounded-md border border-line bg-white px-3 py-1.5 font-normal"
          >
            <option value="">All</option>
            {Object.entries(STATUS_LABELS).map(([value, label]) => (
              <option key={value} value={value}>
                {label}
              </option>
            ))}
          </select>
        </label>
        <button
          type="submit"
          className="rounded-md border border-line bg-card px-3 py-1.5 text-sm font-semibold text-tide-dark hover:border-tide"
        >
          Filter
        </button>
        <p className="text-sm text-ink-soft" aria-live="polite" data-testid="board-count">
          {table.matching} of {table.total} students
          {table.pager.pages > 1 ? ` · ${first}–${first + rows.length - 1} shown` : ""}
        </p>
      </Form>
      <div className="rounded-lg border border-line bg-card">
        <table className="table-cards w-full border-collapse text-left text-sm">
          <caption className="sr-only">
            This week's figures per student, with the change since last week. Column headers sort.
          </caption>
          <thead className="bg-paper text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              {columns.map((c) => {
                const sorted = c.id === query.sort ? query.dir : null;
                return (
                  <th
                    key={c.id}
                    scope="col"
                    className="px-1.5 py-2 align-bottom"
                    aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                  >
                    {c.id === "trend" ? (
                      c.header
                    ) : (
                      <Link
                        to={table.sortLinks[c.id]}
                        preventScrollReset
                        className="inline-flex items-center gap-1 uppercase tracking-wide hover:text-ink"
                      >
                        {c.header}
                        <span aria-hidden="true">{sorted === "asc" ? "↑" : sorted === "desc" ? "↓" : ""}</span>
                      </Link>
                    )}
                  </th>
                );
              })}
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {rows.map((r) => (
              <tr key={r.studentId} className="hover:bg-paper/60" data-testid="board-row">
                {columns.map((c) => (
                  <td
                    key={c.id}
                    className={`px-1.5 py-2 align-middle ${c.id === "name" ? "card-title" : ""}`}
                    data-label={CELL_LABELS[c.id] || undefined}
                    data-column={c.id}
                  >
                    {c.cell(r)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {rows.length === 0 ? (
          <p className="px-4 py-6 text-center text-sm text-ink-soft">No student matches these filters.</p>
        ) : null}
      </div>
      <Pager
        links={table.pager}
        label="Pages of the board's students"
        before="← Previous students"
        after="Next students →"
      />
    </div>
  );
}
