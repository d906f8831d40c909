import { useId, type InputHTMLAttributes, type ReactNode } from "react";

type FieldProps = InputHTMLAttributes<HTMLInputElement> & {
  label: string;
  error?: string | string[] | null;
  hint?: ReactNode;
};

/** A labelled input with its hint and error beside it, wired up for screen readers. */
export function Field({ label, error, hint, className = "", ...input }: FieldProps) {
  const id = useId();
  const message = Array.isArray(error) ? error[0] : error;
  const describedBy = [hint ? `${id}-hint` : null, message ? `${id}-error` : null].filter(Boolean).join(" ");
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={input.id ?? id} className="text-sm font-semibold text-ink">
        {label}
      </label>
      <input
        id={input.id ?? id}
        aria-invalid={message ? true : undefined}
        aria-describedby={describedBy || undefined}
        className={`rounded-md border bg-white px-3 py-2 text-base text-ink shadow-inner outline-none focus:border-tide ${
          message ? "border-brick" : "border-line"
        }`}
        {...input}
      />
      {hint ? (
        <p id={`${id}-hint`} className="text-xs text-ink-soft">
          {hint}
        </p>
      ) : null}
      {message ? (
        <p id={`${id}-error`} className="text-sm text-brick" role="alert">
          {message}
        </p>
      ) : null}
    </div>
  );
}
