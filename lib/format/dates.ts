/**
 * Dates and times as the screens print them: ISO 8601 in UTC with the zone written out
 * (`2026-12-02 05:51 UTC`), so every reader sees the same instant whatever their locale, and the
 * server and the browser render the same text.
 */

function instant(value: string | number | Date, where: string): Date {
  const d = value instanceof Date ? value : new Date(value);
  if (Number.isNaN(d.getTime())) throw new RangeError(`${where}: not a date: ${String(value)}`);
  return d;
}

/** `2026-12-02 05:51 UTC` from an ISO string, epoch milliseconds or a Date. */
export function formatDateTime(value: string | number | Date): string {
  const iso = instant(value, 'formatDateTime').toISOString();
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

/** `2026-12-02` (the UTC calendar day) from an ISO string, epoch milliseconds or a Date. */
export function formatDate(value: string | number | Date): string {
  return instant(value, 'formatDate').toISOString().slice(0, 10);
}

/** {@link formatDateTime}, or an em dash when there is no date. */
export function formatDateTimeOrDash(value: string | number | Date | null | undefined): string {
  return value == null ? '—' : formatDateTime(value);
}
