import type { ButtonHTMLAttributes } from "react";
import { Link, type LinkProps } from "react-router";

const styles = {
  primary: "bg-accent text-paper hover:bg-accent-deep",
  secondary: "border border-rule bg-card text-ink hover:bg-paper-deep",
  danger: "border border-out text-out hover:bg-out hover:text-paper",
};

type Variant = keyof typeof styles;
const base = "inline-flex items-center gap-2 rounded-md px-3.5 py-2 text-sm font-medium transition-colors disabled:opacity-50";

export function Button({ variant = "primary", className = "", ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return <button className={`${base} ${styles[variant]} ${className}`} {...props} />;
}

export function ButtonLink({ variant = "primary", className = "", ...props }: LinkProps & { variant?: Variant }) {
  return <Link className={`${base} ${styles[variant]} ${className}`} {...props} />;
}
