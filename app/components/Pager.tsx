import { Link } from "react-router";
import type { PagerLinks } from "~/utils/listLinks";

/**
 * Links to the page before and after of a list paged on the server (the loader works
 * out the addresses): plain links, so they work before, and without, the page's scripts.
 */
export function Pager({
  links,
  label,
  before = "← Newer page",
  after = "Older page →",
}: {
  links: PagerLinks;
  /** names the navigation for screen readers */
  label: string;
  before?: string;
  after?: string;
}) {
  if (links.pages <= 1) return null;
  const link =
    "rounded-md border border-line bg-card px-3 py-1.5 text-sm font-semibold text-tide-dark hover:border-tide";
  return (
    <nav aria-label={label} className="flex flex-wrap items-center justify-between gap-3">
      {links.prev ? (
        <Link to={links.prev} className={link} rel="prev">
          {before}
        </Link>
      ) : (
        <span />
      )}
      <span className="text-sm text-ink-soft">
        Page {links.page} of {links.pages}
      </span>
      {links.next ? (
        <Link to={links.next} className={link} rel="next">
          {after}
        </Link>
      ) : (
        <span />
      )}
    </nav>
  );
}
