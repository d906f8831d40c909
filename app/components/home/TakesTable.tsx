import type { ReactNode } from "react";
import { Link } from "react-router";
import { DataTable } from "~/components/DataTable";
import { Pager } from "~/components/Pager";
import type { TakeList, TakeListItem } from "~/models/takeList.server";
import type { TakeSort } from "~/utils/takeSort";

const dash = (n: number | null) => n ?? "–";

const COLUMNS: Array<{ id: TakeSort; header: string; numeric: boolean; cell: (t: TakeListItem) => ReactNode }> = [
  {
    id: "date",
    header: "Date",
    numeric: false,
    cell: (t) => (
      <Link
        to={`/takes/${t.id}`}
        className="whitespace-nowrap font-semibold text-tide-dark underline-offset-4 hover:underline"
      >
        {t.day}
      </Link>
    ),
  },
  {
    id: "exercise",
    header: "Exercise",
    numeric: false,
    cell: (t) => (
      <>
        {t.exerciseTitle ?? <span className="text-ink-soft">Free practice</span>}
        {t.key ? <span className="text-ink-soft"> · {t.key}</span> : null}
      </>
    ),
  },
  { id: "chords", header: "Chords", numeric: true, cell: (t) => dash(t.chords) },
  { id: "smoothness", header: "Smoothness", numeric: true, cell: (t) => t.smoothness },
  { id: "leaps", header: "Leaps", numeric: true, cell: (t) => dash(t.leaps) },
  {
    id: "score",
    header: "Score",
    numeric: true,
    cell: (t) =>
      t.failed ? (
        <span className="rounded bg-ochre-pale px-1.5 py-0.5 text-xs font-semibold text-ochre">not analysed</span>
      ) : (
        dash(t.score)
      ),
  },
];

const ARROWS = { asc: "▲", desc: "▼" } as const;

/** Columns a phone leaves out, so the date, exercise, smoothness and score fit without scrolling. */
const WIDE_ONLY = new Set<TakeSort>(["chords", "leaps"]);
const wideOnly = (id: TakeSort) => (WIDE_ONLY.has(id) ? "hidden sm:table-cell" : "");

/**
 * The student's takes a page at a time; every column header is a link to the list sorted
 * on the server by that column (the other way round on a second click), so sorting and
 * paging work before the page's scripts have loaded, and without them.
 */
export function TakesTable({ list, caption }: { list: TakeList; caption: string }) {
  const first = (list.page - 1) * list.pageSize + 1;
  return (
    <div className="flex flex-col gap-2" id="takes">
      <DataTable
        caption={`${caption}; column headers sort the list`}
        head={
          <tr>
            {COLUMNS.map((c) => {
              const sorted = c.id === list.sort ? list.dir : null;
              return (
                <th
                  key={c.id}
                  scope="col"
                  aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                  className={`px-3 py-2 font-semibold sm:px-4 ${c.numeric ? "text-right" : ""} ${wideOnly(c.id)}`}
                >
                  <Link
                    to={list.sortLinks[c.id]}
                    className={`inline-flex items-center gap-1 uppercase tracking-wide hover:text-ink ${sorted ? "text-ink" : ""}`}
                  >
                    {c.header}
                    <span aria-hidden="true" className="w-3 text-xs">
                      {sorted ? ARROWS[sorted] : ""}
                    </span>
                  </Link>
                </th>
              );
            })}
          </tr>
        }
      >
        {list.rows.map((t) => (
          <tr key={t.id} className="hover:bg-paper/60" data-testid="take-row">
            {COLUMNS.map((c) => (
              <td
                key={c.id}
                className={`px-3 py-2 sm:px-4 ${c.numeric ? "text-right tabular-nums" : ""} ${wideOnly(c.id)}`}
              >
                {c.cell(t)}
              </td>
            ))}
          </tr>
        ))}
      </DataTable>
      {list.pager.pages > 1 ? (
        <p className="text-sm text-ink-soft">
          Takes {first}–{first + list.rows.length - 1} of {list.total}
        </p>
      ) : null}
      <Pager links={list.pager} label="Pages of your takes" />
    </div>
  );
}
