import { forwardRef, type InputHTMLAttributes, type SelectHTMLAttributes } from "react";

interface FieldShellProps {
  id: string;
  label: string;
  hint?: string;
  error?: string;
  children: React.ReactNode;
}

/** A labelled form field with its hint and its error, wired for screen readers. */
export function FieldShell({ id, label, hint, error, children }: FieldShellProps) {
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium text-ink-800">
        {label}
      </label>
      {children}
      {hint && !error ? (
        <p id={`${id}-hint`} className="text-xs text-ink-500">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} role="alert" className="text-xs font-medium text-danger-700">
          {error}
        </p>
      ) : null}
    </div>
  );
}

const inputClass = (error?: string) =>
  `block w-full rounded-md border bg-white px-3 py-2 text-sm text-ink-900 shadow-sm placeholder:italic placeholder:text-ink-500 ${error ? "border-danger-700 ring-1 ring-danger-700" : "border-ink-200"}`;

type InputProps = InputHTMLAttributes<HTMLInputElement> & { id: string; label: string; hint?: string; error?: string };

export const TextField = forwardRef<HTMLInputElement, InputProps>(function TextField({ id, label, hint, error, className = "", ...rest }, ref) {
  return (
    <FieldShell id={id} label={label} hint={hint} error={error}>
      <input
        ref={ref}
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}
        className={`${inputClass(error)} ${className}`}
        {...rest}
      />
    </FieldShell>
  );
});

type SelectProps = SelectHTMLAttributes<HTMLSelectElement> & { id: string; label: string; hint?: string; error?: string };

export const SelectField = forwardRef<HTMLSelectElement, SelectProps>(function SelectField({ id, label, hint, error, children, ...rest }, ref) {
  return (
    <FieldShell id={id} label={label} hint={hint} error={error}>
      <select ref={ref} id={id} aria-invalid={error ? true : undefined} className={inputClass(error)} {...rest}>
        {children}
      </select>
    </FieldShell>
  );
});

export function FormMessage({ tone = "error", children }: { tone?: "error" | "info"; children: React.ReactNode }) {
  if (!children) return null;
  return (
    <p
      role={tone === "error" ? "alert" : "status"}
      className={`rounded-md px-3 py-2 text-sm ${tone === "error" ? "bg-danger-100 text-danger-700" : "bg-charge-100 text-charge-700"}`}
    >
      {children}
    </p>
  );
}
