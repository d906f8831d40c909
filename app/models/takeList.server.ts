// A student's takes a page at a time, sorted on the server: the student's own list on
// the home page and a teacher's view of one student read the page, the column and the
// direction from the address, so every page and every order is a plain link.
import { and, asc, count, desc, eq, sql, type SQL } from "drizzle-orm";
import { z } from "zod";
import { db } from "~/db/client.server";
import { exercises, takeMetrics, takes } from "~/db/schema";
import { hrefWith, pagerLinks, type PagerLinks } from "~/utils/listLinks";
import { percent, pretty } from "~/utils/plainText";
import { studioShortDate } from "~/utils/studioTime";
import { firstDirection, TAKE_SORTS, type SortDirection, type TakeSort } from "~/utils/takeSort";
import type { TakeListRow } from "./takes.server";

export const TAKES_PAGE_SIZE = 20;

export const takeListQuerySchema = z.object({
  sort: z.enum(TAKE_SORTS).catch("date"),
  dir: z.enum(["asc", "desc"]).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(10_000).catch(1),
});
export type TakeListQuery = { sort: TakeSort; dir: SortDirection; page: number };

/** Reads the list's search params; a bad value falls back to its default rather than an error. */
export function readTakeListQuery(params: URLSearchParams): TakeListQuery {
  const q = takeListQuerySchema.parse({
    sort: params.get("sort") ?? undefined,
    dir: params.get("dir") ?? undefined,
    page: params.get("page") ?? undefined,
  });
  return { sort: q.sort, dir: q.dir ?? firstDirection(q.sort), page: q.page };
}

// Takes without a figure (failed, or still waiting) come after every analysed take either way.
const SORT_COLUMNS: Record<TakeSort, (dir: SortDirection) => SQL> = {
  date: (dir) => (dir === "asc" ? asc(takes.recordedAt) : desc(takes.recordedAt)),
  exercise: (dir) => sql`coalesce(${exercises.title}, '') collate nocase ${sql.raw(dir)}`,
  chords: (dir) => sql`${takeMetrics.chordCount} ${sql.raw(dir)} nulls last`,
  smoothness: (dir) => sql`${takeMetrics.smoothness} ${sql.raw(dir)} nulls last`,
  leaps: (dir) => sql`${takeMetrics.rootPositionLeaps} ${sql.raw(dir)} nulls last`,
  score: (dir) => sql`${takeMetrics.score} ${sql.raw(dir)} nulls last`,
};

/**
 * One page of a student's takes in one studio, with the total and the page actually
 * shown (a page past the end shows the last). Ties go newest first, then by id, so
 * pages never overlap.
 */
export function studentTakesPage(
  studentId: string,
  studioId: string,
  q: TakeListQuery,
  pageSize = TAKES_PAGE_SIZE,
): { rows: TakeListRow[]; total: number; page: number; pages: number; pageSize: number } {
  const where = and(eq(takes.studentId, studentId), eq(takes.studioId, studioId));
  const total = db().select({ n: count() }).from(takes).where(where).get()?.n ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const page = Math.min(q.page, pages);
  const rows = db()
    .select({
      id: takes.id,
      recordedAt: takes.recordedAt,
      exerciseId: takes.exerciseId,
      exerciseTitle: exercises.title,
      key: takes.key,
      status: takes.status,
      error: takes.error,
      originalName: takes.originalName,
      chordCount: takeMetrics.chordCount,
      smoothness: takeMetrics.smoothness,
      rootPositionLeaps: takeMetrics.rootPositionLeaps,
      score: takeMetrics.score,
      accuracy: takeMetrics.accuracy,
    })
    .from(takes)
    .leftJoin(exercises, eq(exercises.id, takes.exerciseId))
    .leftJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
    .where(where)
    .orderBy(SORT_COLUMNS[q.sort](q.dir), desc(takes.recordedAt), desc(takes.createdAt), asc(takes.id))
    .limit(pageSize)
    .offset((page - 1) * pageSize)
    .all()
    .map((r) => ({ ...r, recordedAt: r.recordedAt.toISOString() }));
  return { rows, total, page, pages, pageSize };
}

/** A take as the student's list shows it, its words already in the studio's calendar and typography. */
export type TakeListItem = {
  id: string;
  /** "Wed 2 Dec", the day it was played in the studio's calendar */
  day: string;
  exerciseTitle: string | null;
  /** the key with typographic accidentals ("B♭") */
  key: string | null;
  failed: boolean;
  chords: number | null;
  /** "87%", or "–" without a figure */
  smoothness: string;
  leaps: number | null;
  score: number | null;
};

export type TakeList = {
  rows: TakeListItem[];
  total: number;
  page: number;
  pageSize: number;
  sort: TakeSort;
  dir: SortDirection;
  /** the address of each column's order (the other way round for the order shown), from page 1 */
  sortLinks: Record<TakeSort, string>;
  pager: PagerLinks;
};

/** The anchor of the list on its page, so a new page or order opens at the list. */
export const TAKE_LIST_ANCHOR = "#takes";

/** The address that sorts the list at `url` by `sort`: reversed if it is the order shown; the default order has no params. */
export function sortHref(url: URL, shown: Pick<TakeListQuery, "sort" | "dir">, sort: TakeSort): string {
  const dir = sort === shown.sort ? (shown.dir === "asc" ? "desc" : "asc") : firstDirection(sort);
  const isDefault = sort === "date" && dir === "desc";
  return hrefWith(url, { page: null, sort: isDefault ? null : sort, dir: isDefault ? null : dir }, TAKE_LIST_ANCHOR);
}

/** One page of a student's takes for the page at `url` (its sort, direction and page), ready to show. */
export function studentTakeList(studentId: string, studioId: string, url: URL, timeZone: string): TakeList {
  const q = readTakeListQuery(url.searchParams);
  const list = studentTakesPage(studentId, studioId, q);
  return {
    rows: list.rows.map((t) => ({
      id: t.id,
      day: studioShortDate(t.recordedAt, timeZone),
      exerciseTitle: t.exerciseTitle,
      key: t.key ? pretty(t.key) : null,
      failed: t.status === "failed",
      chords: t.chordCount,
      smoothness: percent(t.smoothness),
      leaps: t.rootPositionLeaps,
      score: t.score,
    })),
    total: list.total,
    page: list.page,
    pageSize: list.pageSize,
    sort: q.sort,
    dir: q.dir,
    sortLinks: Object.fromEntries(TAKE_SORTS.map((s) => [s, sortHref(url, q, s)])) as Record<TakeSort, string>,
    pager: pagerLinks(url, list.page, list.pages, TAKE_LIST_ANCHOR),
  };
}
