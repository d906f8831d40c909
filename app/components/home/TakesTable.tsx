import {
  createColumnHelper,
  createSortedRowModel,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  tableFeatures,
  useTable,
} from "@tanstack/react-table";
import { useState } from "react";
import { Link } from "react-router";
import { DataTable } from "~/components/DataTable";
import { dayLabel, percent, pretty } from "~/utils/noteText";

export type TakeRow = {
  id: string;
  recordedAt: string;
  /** The day it was recorded, as the studio's own calendar has it ("Wed 2 Dec"); set by the loader. */
  recordedDay?: string;
  exerciseTitle: string | null;
  key: string | null;
  status: string;
  chordCount: number | null;
  smoothness: number | null;
  rootPositionLeaps: number | null;
  score: number | null;
};

const features = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
});
const column = createColumnHelper<typeof features, TakeRow>();

// Failed takes have no figures; they sort after every analysed take either way.
const figure = { sortFn: "basic" as const, sortUndefined: "last" as const };

const columns = column.columns([
  column.accessor("recordedAt", {
    header: "Date",
    sortFn: "basic",
    cell: (info) => (
      <Link
        to={`/takes/${info.row.original.id}`}
        className="whitespace-nowrap font-semibold text-tide-dark underline-offset-4 hover:underline"
      >
        {info.row.original.recordedDay ?? dayLabel(info.getValue())}
      </Link>
    ),
  }),
  column.accessor((r) => r.exerciseTitle ?? "", {
    id: "exercise",
    header: "Exercise",
    sortFn: "alphanumeric",
    cell: (info) => (
      <>
        {info.row.original.exerciseTitle ?? <span className="text-ink-soft">Free practice</span>}
        {info.row.original.key ? <span className="text-ink-soft"> · {pretty(info.row.original.key)}</span> : null}
      </>
    ),
  }),
  column.accessor((r) => r.chordCount ?? undefined, {
    id: "chords",
    header: "Chords",
    ...figure,
    cell: (info) => info.getValue() ?? "–",
  }),
  column.accessor((r) => r.smoothness ?? undefined, {
    id: "smoothness",
    header: "Smoothness",
    ...figure,
    cell: (info) => percent(info.getValue()),
  }),
  column.accessor((r) => r.rootPositionLeaps ?? undefined, {
    id: "leaps",
    header: "Leaps",
    ...figure,
    cell: (info) => info.getValue() ?? "–",
  }),
  column.accessor((r) => r.score ?? undefined, {
    id: "score",
    header: "Score",
    ...figure,
    cell: (info) =>
      info.row.original.status === "failed" ? (
        <span className="rounded bg-ochre-pale px-1.5 py-0.5 text-xs font-semibold text-ochre">not analysed</span>
      ) : (
        (info.getValue() ?? "–")
      ),
  }),
]);

const ARROWS = { asc: "▲", desc: "▼" } as const;

/** Columns a phone leaves out, so the date, exercise, smoothness and score fit without scrolling. */
const WIDE_ONLY = new Set(["chords", "leaps"]);
const wideOnly = (id: string) => (WIDE_ONLY.has(id) ? "hidden sm:table-cell" : "");

/** The student's latest takes; every column header sorts (click, or Enter/Space on its button). */
export function TakesTable({ takes, firstRows = 12 }: { takes: TakeRow[]; firstRows?: number }) {
  const [showAll, setShowAll] = useState(false);
  const table = useTable({
    features,
    columns,
    data: takes,
    initialState: { sorting: [{ id: "recordedAt", desc: true }] },
  });
  const rows = table.getRowModel().rows;
  const visible = showAll ? rows : rows.slice(0, firstRows);
  return (
    <div className="flex flex-col gap-2">
      <DataTable
        caption="Your latest takes; column headers sort the table"
        head={table.getHeaderGroups().map((group) => (
          <tr key={group.id}>
            {group.headers.map((header) => {
              const sorted = header.column.getIsSorted();
              const numeric = header.column.id !== "exercise" && header.column.id !== "recordedAt";
              return (
                <th
                  key={header.id}
                  scope="col"
                  aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                  className={`px-3 py-2 font-semibold sm:px-4 ${numeric ? "text-right" : ""} ${wideOnly(header.column.id)}`}
                >
                  <button
                    type="button"
                    onClick={header.column.getToggleSortingHandler()}
                    className={`inline-flex items-center gap-1 uppercase tracking-wide hover:text-ink ${sorted ? "text-ink" : ""}`}
                  >
                    <table.FlexRender header={header} />
                    <span aria-hidden="true" className="w-3 text-xs">
                      {sorted ? ARROWS[sorted] : ""}
                    </span>
                  </button>
                </th>
              );
            })}
          </tr>
        ))}
      >
        {visible.map((row) => (
          <tr key={row.id} className="hover:bg-paper/60" data-testid="take-row">
            {row.getAllCells().map((cell) => (
              <td
                key={cell.id}
                className={`px-3 py-2 sm:px-4 ${cell.column.id !== "exercise" && cell.column.id !== "recordedAt" ? "text-right tabular-nums" : ""} ${wideOnly(cell.column.id)}`}
              >
                <table.FlexRender cell={cell} />
              </td>
            ))}
          </tr>
        ))}
      </DataTable>
      {rows.length > firstRows ? (
        <button
          type="button"
          onClick={() => setShowAll(!showAll)}
          className="self-start text-sm font-semibold text-tide-dark hover:underline"
        >
          {showAll ? `Show the latest ${firstRows} only` : `Show all ${rows.length} takes`}
        </button>
      ) : null}
    </div>
  );
}
