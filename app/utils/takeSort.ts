// The orders a student's list of takes offers; the server sorts, the table's headers link to each order.

/** The columns a student's takes sort by ("date" is when the take was played). */
export const TAKE_SORTS = ["date", "exercise", "chords", "smoothness", "leaps", "score"] as const;
export type TakeSort = (typeof TAKE_SORTS)[number];
export type SortDirection = "asc" | "desc";

/** Which way a column sorts when first chosen: names A to Z, dates and figures highest first. */
export function firstDirection(sort: TakeSort): SortDirection {
  return sort === "exercise" ? "asc" : "desc";
}
