import type { ReactNode } from "react";

/** What to show when a list has nothing in it yet: say why, and what to do next. */
export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="flex flex-col items-center gap-3 rounded-lg border border-dashed border-line bg-card/60 px-6 py-10 text-center">
      <svg aria-hidden="true" viewBox="0 0 48 24" className="h-6 w-12 text-tide">
        <path
          d="M2 18c6-10 12-10 18 0s12 10 26-12"
          fill="none"
          stroke="currentColor"
          strokeWidth="3"
          strokeLinecap="round"
        />
      </svg>
      <p className="text-lg font-semibold">{title}</p>
      {children ? <div className="max-w-md text-sm text-ink-soft">{children}</div> : null}
      {action}
    </div>
  );
}
