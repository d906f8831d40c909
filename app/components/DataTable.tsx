import type { ReactNode } from "react";

/**
 * The table frame every list in Nearnote shares: caption for screen readers,
 * a scrolling wrapper on narrow screens (or cards, with `cards`), and the empty
 * state in place of rows.
 */
export function DataTable({
  caption,
  head,
  children,
  empty,
  isEmpty,
  cards = false,
}: {
  caption: string;
  head: ReactNode;
  children: ReactNode;
  empty?: ReactNode;
  isEmpty?: boolean;
  /** On a phone each row becomes a card; cells name their column with data-label. */
  cards?: boolean;
}) {
  if (isEmpty && empty) return <>{empty}</>;
  return (
    <div className="overflow-x-auto rounded-lg border border-line bg-card">
      <table className={`w-full border-collapse text-left text-sm ${cards ? "table-cards" : ""}`}>
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper text-xs uppercase tracking-wide text-ink-soft">{head}</thead>
        <tbody className="divide-y divide-line">{children}</tbody>
      </table>
    </div>
  );
}
