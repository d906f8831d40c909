// The progress board's student table on the server: filtered by name and status,
// sorted by a column and cut into pages of BOARD_PAGE_SIZE students, all read from
// the address, so a studio of hundreds sends one page and every control is a link
// or a GET form that works without scripts.
import { z } from "zod";
import { TECHNIQUES } from "~/analysis/types";
import { hrefWith, pagerLinks, type PagerLinks } from "~/utils/listLinks";
import type { MetricId } from "~/utils/progressFigures";
import type { BoardRow, StudentStatus } from "./board.server";

export const BOARD_PAGE_SIZE = 50;

/** The board's metric columns, in the table's order. */
export const BOARD_METRICS = [
  "takes",
  "practiceMinutes",
  "score",
  "smoothness",
  "motionPerChange",
  "leapsPer10",
  "accuracy",
] as const satisfies readonly MetricId[];

export const BOARD_SORTS = ["name", "status", ...BOARD_METRICS, "techniques", "lastTake"] as const;
export type BoardSort = (typeof BOARD_SORTS)[number];
type Direction = "asc" | "desc";

const STATUSES = ["improving", "level", "slipping", "stopped", "new", "early"] as const satisfies StudentStatus[];

/** Which way a column sorts when first chosen: words A to Z, figures and dates highest first. */
export function firstBoardDirection(sort: BoardSort): Direction {
  return sort === "name" || sort === "status" ? "asc" : "desc";
}

const boardQuerySchema = z.object({
  name: z.string().trim().max(100).catch(""),
  status: z.enum(STATUSES).optional().catch(undefined),
  sort: z.enum(BOARD_SORTS).catch("name"),
  dir: z.enum(["asc", "desc"]).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(10_000).catch(1),
});
export type BoardTableQuery = {
  name: string;
  status: StudentStatus | undefined;
  sort: BoardSort;
  dir: Direction;
  page: number;
};

/** Reads the table's search params; a bad value falls back to its default rather than an error. */
export function readBoardTableQuery(params: URLSearchParams): BoardTableQuery {
  const q = boardQuerySchema.parse({
    name: params.get("name") ?? "",
    status: params.get("status") || undefined,
    sort: params.get("sort") ?? undefined,
    dir: params.get("dir") ?? undefined,
    page: params.get("page") ?? undefined,
  });
  return { name: q.name, status: q.status, sort: q.sort, dir: q.dir ?? firstBoardDirection(q.sort), page: q.page };
}

/** The value a row sorts by in a column; null (no figure that week, never a take) sorts last either way. */
function sortValue(row: BoardRow, sort: BoardSort): string | number | null {
  switch (sort) {
    case "name":
      return row.name;
    case "status":
      return row.status;
    case "techniques":
      return TECHNIQUES.filter((t) => row.thisWeek.techniques[t] > 0).length;
    case "lastTake":
      return row.lastTakeAt;
    default:
      return row.thisWeek[sort];
  }
}

const words = new Intl.Collator("en", { sensitivity: "base", numeric: true });

function compareRows(a: BoardRow, b: BoardRow, q: Pick<BoardTableQuery, "sort" | "dir">): number {
  const va = sortValue(a, q.sort);
  const vb = sortValue(b, q.sort);
  if (va === null || vb === null) return va === vb ? 0 : va === null ? 1 : -1;
  const order = typeof va === "string" ? words.compare(va, String(vb)) : va - (vb as number);
  return q.dir === "asc" ? order : -order;
}

export type BoardTable = {
  rows: BoardRow[];
  /** students the filters leave, and students on the board */
  matching: number;
  total: number;
  pageSize: number;
  query: BoardTableQuery;
  /** each column's order (the other way round for the order shown), from page 1, filters kept */
  sortLinks: Record<BoardSort, string>;
  pager: PagerLinks;
  /** the address's other params (week, chart), for the filter form to carry along */
  keep: Array<[string, string]>;
};

/** The anchor of the table on the board, so a new page or order opens at the table. */
export const BOARD_TABLE_ANCHOR = "#students";

const TABLE_PARAMS = new Set(["name", "status", "sort", "dir", "page"]);

/** One page of the board's table for the board at `url`; ties keep the board's own order (by name). */
export function boardTable(all: BoardRow[], url: URL, pageSize = BOARD_PAGE_SIZE): BoardTable {
  const query = readBoardTableQuery(url.searchParams);
  const needle = query.name.toLocaleLowerCase("en");
  const matching = all
    .filter(
      (r) =>
        (!needle || r.name.toLocaleLowerCase("en").includes(needle)) && (!query.status || r.status === query.status),
    )
    .map((row, i) => ({ row, i }))
    .sort((a, b) => compareRows(a.row, b.row, query) || a.i - b.i)
    .map((x) => x.row);
  const pages = Math.max(1, Math.ceil(matching.length / pageSize));
  const page = Math.min(query.page, pages);
  const sortLinks = Object.fromEntries(
    BOARD_SORTS.map((sort) => {
      const dir = sort === query.sort ? (query.dir === "asc" ? "desc" : "asc") : firstBoardDirection(sort);
      const isDefault = sort === "name" && dir === "asc";
      return [
        sort,
        hrefWith(url, { page: null, sort: isDefault ? null : sort, dir: isDefault ? null : dir }, BOARD_TABLE_ANCHOR),
      ];
    }),
  ) as Record<BoardSort, string>;
  return {
    rows: matching.slice((page - 1) * pageSize, page * pageSize),
    matching: matching.length,
    total: all.length,
    pageSize,
    query: { ...query, page },
    sortLinks,
    pager: pagerLinks(url, page, pages, BOARD_TABLE_ANCHOR),
    keep: [...url.searchParams].filter(([k]) => !TABLE_PARAMS.has(k)),
  };
}
