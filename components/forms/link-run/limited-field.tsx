import type { InputHTMLAttributes } from 'react';

const control =
  'w-full rounded-md border bg-white px-3 py-2 text-sm shadow-inner shadow-black/[0.02] focus:outline-none focus:ring-2';

/**
 * A text field that states its limit beside it and, when the value breaks it, says so under the
 * field (the button stays usable: a form that refuses must say why).
 */
export function LimitedField({
  label,
  limit,
  error,
  hint,
  id,
  ...props
}: InputHTMLAttributes<HTMLInputElement> & {
  label: string;
  limit: string;
  error?: string | null;
  hint?: string;
  id: string;
}) {
  return (
    <div className="block space-y-1 text-sm">
      <label htmlFor={id} className="block font-medium text-ink">
        {label}
      </label>
      <input
        id={id}
        className={`${control} ${error ? 'border-danger focus:ring-danger/20' : 'border-rule focus:border-accent focus:ring-accent/20'}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-limit${error ? ` ${id}-error` : ''}`}
        {...props}
      />
      <span id={`${id}-limit`} className="block text-xs text-ink-soft">
        {limit}
        {hint ? ` ${hint}` : ''}
      </span>
      {error && (
        <span id={`${id}-error`} role="alert" className="block text-xs text-danger">
          {error}
        </span>
      )}
    </div>
  );
}
