import type { ButtonHTMLAttributes } from "react";
import { Link, type LinkProps } from "react-router";

type Variant = "primary" | "secondary" | "danger" | "quiet";

const variants: Record<Variant, string> = {
  primary: "bg-tide text-white hover:bg-tide-dark border-transparent",
  secondary: "bg-card text-ink border-line hover:border-tide hover:text-tide-dark",
  danger: "bg-brick text-white border-transparent hover:opacity-90",
  quiet: "bg-transparent text-tide-dark border-transparent hover:bg-tide-pale",
};

export function buttonClass(variant: Variant = "primary") {
  return `inline-flex items-center justify-center gap-2 rounded-md border px-4 py-2 text-sm font-semibold transition disabled:cursor-not-allowed disabled:opacity-60 ${variants[variant]}`;
}

type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  variant?: Variant;
  /** Shows a busy label and disables the button while a form submits. */
  pending?: boolean;
  pendingLabel?: string;
};

export function Button({ variant = "primary", pending, pendingLabel, className = "", children, ...rest }: ButtonProps) {
  return (
    <button
      type="submit"
      {...rest}
      disabled={rest.disabled || pending}
      aria-busy={pending || undefined}
      className={`${buttonClass(variant)} ${className}`}
    >
      {pending ? (pendingLabel ?? "Working…") : children}
    </button>
  );
}

export function ButtonLink({ variant = "primary", className = "", ...rest }: LinkProps & { variant?: Variant }) {
  return <Link {...rest} className={`${buttonClass(variant)} ${className}`} />;
}
