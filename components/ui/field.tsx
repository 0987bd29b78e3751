import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes } from "react";

export const inputClass =
  "block w-full rounded-md border border-ink-line bg-white px-3 py-2 text-sm text-ink shadow-sm placeholder:text-ink-muted focus:border-frost-500 aria-[invalid=true]:border-flag-600";

type FieldProps = { label: string; name: string; error?: string; hint?: ReactNode; children?: ReactNode };

export function Field({ label, name, error, hint, children }: FieldProps) {
  return (
    <div className="space-y-1">
      <label htmlFor={name} className="block text-sm font-medium text-ink-soft">
        {label}
      </label>
      {children}
      {hint && !error && <p className="text-xs text-ink-muted">{hint}</p>}
      {error && (
        <p id={`${name}-error`} role="alert" className="text-xs font-medium text-flag-700">
          {error}
        </p>
      )}
    </div>
  );
}

export function TextInput({ name, error, ...props }: InputHTMLAttributes<HTMLInputElement> & { name: string; error?: string }) {
  return <input id={name} name={name} aria-invalid={error ? true : undefined} aria-describedby={error ? `${name}-error` : undefined} className={inputClass} {...props} />;
}

export function Select({ name, error, children, ...props }: SelectHTMLAttributes<HTMLSelectElement> & { name: string; error?: string }) {
  return (
    <select id={name} name={name} aria-invalid={error ? true : undefined} className={inputClass} {...props}>
      {children}
    </select>
  );
}
