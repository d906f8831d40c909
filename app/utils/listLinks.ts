// Addresses for lists paged and sorted on the server, worked out by the loader from the
// page's own address, so every page and every order is a plain link (scripts or not).

/** `url` with `changes` applied to its search params (null removes one), as a path and query, plus an anchor. */
export function hrefWith(url: URL, changes: Record<string, string | null>, anchor = ""): string {
  const next = new URLSearchParams(url.search);
  for (const [name, value] of Object.entries(changes)) {
    if (value === null) next.delete(name);
    else next.set(name, value);
  }
  const query = next.toString();
  return `${url.pathname}${query ? `?${query}` : ""}${anchor}`;
}

export type PagerLinks = { page: number; pages: number; prev: string | null; next: string | null };

/** The page before and after `page` of a list at `url` (page 1 carries no page param). */
export function pagerLinks(url: URL, page: number, pages: number, anchor = "", param = "page"): PagerLinks {
  const at = (n: number) => hrefWith(url, { [param]: n === 1 ? null : String(n) }, anchor);
  return { page, pages, prev: page > 1 ? at(page - 1) : null, next: page < pages ? at(page + 1) : null };
}
