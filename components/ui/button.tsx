import type { ButtonHTMLAttributes } from "react";

const variants = {
  primary: "bg-copper-600 text-white hover:bg-copper-700 disabled:bg-ink-300 disabled:text-ink-900",
  secondary: "bg-white text-ink-800 ring-1 ring-ink-200 hover:bg-ink-50 disabled:text-ink-300",
  quiet: "text-ink-700 hover:bg-ink-100",
  danger: "bg-danger-500 text-white hover:bg-danger-700",
} as const;

export function buttonClass(variant: keyof typeof variants = "primary", extra = "") {
  return `inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed ${variants[variant]} ${extra}`;
}

export function Button({ variant = "primary", className = "", ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: keyof typeof variants }) {
  return <button className={buttonClass(variant, className)} {...props} />;
}
