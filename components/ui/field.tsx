import type { InputHTMLAttributes, SelectHTMLAttributes } from 'react';

const control =
  'w-full rounded-md border border-rule bg-white px-3 py-2 text-sm shadow-inner shadow-black/[0.02] focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/20';

export function TextField({
  label,
  hint,
  ...props
}: InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string }) {
  return (
    <label className="block space-y-1 text-sm">
      <span className="font-medium text-ink">{label}</span>
      <input className={control} {...props} />
      {hint && <span className="block text-xs text-ink-soft">{hint}</span>}
    </label>
  );
}

export function SelectField({
  label,
  children,
  ...props
}: SelectHTMLAttributes<HTMLSelectElement> & { label: string }) {
  return (
    <label className="block space-y-1 text-sm">
      <span className="font-medium text-ink">{label}</span>
      <select className={control} {...props}>
        {children}
      </select>
    </label>
  );
}
