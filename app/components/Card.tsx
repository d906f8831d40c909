import type { HTMLAttributes, ReactNode } from "react";

export function Card({
  title,
  actions,
  className = "",
  children,
  ...rest
}: HTMLAttributes<HTMLElement> & { title?: ReactNode; actions?: ReactNode }) {
  return (
    <section className={`rounded-lg border border-line bg-card p-5 shadow-sm ${className}`} {...rest}>
      {title || actions ? (
        <div className="mb-3 flex items-center justify-between gap-3">
          {title ? <h2 className="text-lg font-semibold">{title}</h2> : <span />}
          {actions}
        </div>
      ) : null}
      {children}
    </section>
  );
}
