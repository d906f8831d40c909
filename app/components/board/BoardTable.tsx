import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_equalsString,
  filterFn_includesString,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  tableFeatures,
  useTable,
  type SortingState,
} from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { Link } from "react-router";
import { TECHNIQUES } from "~/analysis/types";
import { TECHNIQUE_WORDS } from "~/takes/takeWords";
import { METRICS, type MetricId } from "~/utils/progressFigures";
import type { BoardRow } from "~/models/board.server";
import { Delta } from "./Delta";
import { Sparkline } from "./Sparkline";
import { STATUS_LABELS, StatusBadge } from "./StatusBadge";

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
  filterFns: { includesString: filterFn_includesString, equalsString: filterFn_equalsString },
});

/** Short tags for the techniques column; the full name is the tooltip and what screen readers get. */
const TECHNIQUE_SHORT: Record<(typeof TECHNIQUES)[number], string> = {
  "added-second": "add2",
  inversion: "inv",
  "open-voicing": "open",
  "slash-bass": "bass",
  "grace-to-third": "grace",
  "smooth-top-line": "top",
};

const col = createColumnHelper<typeof features, BoardRow>();

/** A this-week metric with its change since last week; weeks without a value sort last. */
function metricColumn(metric: MetricId) {
  return col.accessor((r) => r.thisWeek[metric], {
    id: metric,
    header: METRICS[metric].short,
    sortFn: "basic",
    sortUndefined: "last",
    cell: (info) => (
      <Delta metric={metric} now={info.row.original.thisWeek[metric]} before={info.row.original.lastWeek[metric]} />
    ),
  });
}

/** The board's columns; dates print in the studio's calendar. */
function boardColumns(timeZone: string) {
  return col.columns([
    col.accessor("name", {
      header: "Student",
      sortFn: "alphanumeric",
      filterFn: "includesString",
      cell: (info) => (
        <span className="inline-flex flex-col">
          <Link
            to={`/students/${info.row.original.studentId}`}
            className="whitespace-nowrap font-semibold text-tide-dark hover:underline"
          >
            {info.getValue()}
          </Link>
          <Link
            to={`/reports/${info.row.original.studentId}`}
            className="text-xs text-tide-dark underline-offset-2 hover:underline"
            aria-label={`Report for ${info.row.original.name}`}
          >
            Report
          </Link>
        </span>
      ),
    }),
    col.accessor("status", {
      header: "Status",
      sortFn: "alphanumeric",
      filterFn: "equalsString",
      cell: (info) => <StatusBadge status={info.getValue()} compare={info.row.original.compare} />,
    }),
    metricColumn("takes"),
    metricColumn("practiceMinutes"),
    metricColumn("score"),
    metricColumn("smoothness"),
    metricColumn("motionPerChange"),
    metricColumn("leapsPer10"),
    metricColumn("accuracy"),
    col.accessor((r) => TECHNIQUES.filter((t) => r.thisWeek.techniques[t] > 0).length, {
      id: "techniques",
      header: "Techniques",
      sortFn: "basic",
      cell: (info) => {
        const used = TECHNIQUES.filter((t) => info.row.original.thisWeek.techniques[t] > 0);
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
    }),
    col.accessor((r) => r.lastTakeAt ?? "", {
      id: "lastTake",
      header: "Last take",
      sortFn: "alphanumeric",
      cell: (info) =>
        info.row.original.lastTakeAt ? (
          <time dateTime={info.row.original.lastTakeAt} className="whitespace-nowrap">
            {shortDate(info.row.original.lastTakeAt, timeZone)}
          </time>
        ) : (
          "never"
        ),
    }),
    col.display({
      id: "trend",
      header: "Trend",
      cell: (info) => (
        <Sparkline
          width={60}
          values={info.row.original.trend}
          label={`${info.row.original.name}'s mean score over 8 weeks`}
        />
      ),
    }),
  ]);
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

export function BoardTable({ rows, timeZone }: { rows: BoardRow[]; timeZone: string }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [nameFilter, setNameFilter] = useState("");
  const [statusFilter, setStatusFilter] = useState("");
  const columnFilters = [
    ...(nameFilter ? [{ id: "name", value: nameFilter }] : []),
    ...(statusFilter ? [{ id: "status", value: statusFilter }] : []),
  ];
  const columns = useMemo(() => boardColumns(timeZone), [timeZone]);
  const table = useTable({
    features,
    columns,
    data: rows,
    state: { sorting, columnFilters },
    onSortingChange: setSorting,
    getRowId: (r) => r.studentId,
  });
  const shown = table.getRowModel().rows;
  return (
    <div className="flex flex-col gap-3">
      <div className="no-print flex flex-wrap items-end gap-4" role="search" aria-label="Filter students">
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Name
          <input
            type="search"
            value={nameFilter}
            onChange={(e) => setNameFilter(e.target.value)}
            placeholder="Type to filter"
            className="rounded-md border border-line bg-white px-3 py-1.5 font-normal"
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Status
          <select
            value={statusFilter}
            onChange={(e) => setStatusFilter(e.target.value)}
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
        <p className="text-sm text-ink-soft" aria-live="polite">
          {shown.length} of {rows.length} students
        </p>
      </div>
      <div className="rounded-lg border border-line bg-card">
        <table className="table-cards w-full border-collapse text-left text-sm">
          <caption className="sr-only">
            This week's figures per student, with the change since last week. Column headers sort.
          </caption>
          <thead className="bg-paper text-xs uppercase tracking-wide text-ink-soft">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className="px-1.5 py-2 align-bottom"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 uppercase tracking-wide hover:text-ink"
                        >
                          <table.FlexRender header={header} />
                          <span aria-hidden="true">{sorted === "asc" ? "↑" : sorted === "desc" ? "↓" : ""}</span>
                        </button>
                      ) : (
                        <table.FlexRender header={header} />
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-line">
            {shown.map((row) => (
              <tr key={row.id} className="hover:bg-paper/60" data-testid="board-row">
                {row.getAllCells().map((cell) => (
                  <td
                    key={cell.id}
                    className={`px-1.5 py-2 align-middle ${cell.column.id === "name" ? "card-title" : ""}`}
                    data-label={CELL_LABELS[cell.column.id] || undefined}
                    data-column={cell.column.id}
                  >
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {shown.length === 0 ? (
          <p className="px-4 py-6 text-center text-sm text-ink-soft">No student matches these filters.</p>
        ) : null}
      </div>
    </div>
  );
}
