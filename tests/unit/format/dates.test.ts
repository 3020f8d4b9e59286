import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime, formatDateTimeOrDash } from '@/lib/format/dates';

describe('formatDateTime', () => {
  it('prints the UTC instant in ISO 8601 order with the zone', () => {
    // ISO 8601: 05:51:38 UTC written with an offset of +09:00 is 14:51:38 local
    expect(formatDateTime('2026-12-02T14:51:38+09:00')).toBe('2026-12-02 05:51 UTC');
    // exact: 1 780 000 000 000 ms after the Unix epoch is 2026-05-28T20:26:40Z
    expect(formatDateTime(1_780_000_000_000)).toBe('2026-05-28 20:26 UTC');
  });

  it('rolls over the day in UTC, not in the local zone', () => {
    // ISO 8601: 23:30 at −05:00 is 04:30 the next day in UTC
    expect(formatDateTime(new Date('2026-12-31T23:30:00-05:00'))).toBe('2027-01-01 04:30 UTC');
    expect(formatDate('2026-12-31T23:30:00-05:00')).toBe('2027-01-01');
  });

  it('names the value it cannot read', () => {
    expect(() => formatDateTime('12/2/2026, 5:51:38 AM PST-ish')).toThrow(RangeError);
    expect(() => formatDate('yesterday')).toThrow(/formatDate: not a date: yesterday/);
  });

  it('prints a dash for no date', () => {
    expect(formatDateTimeOrDash(null)).toBe('—');
    expect(formatDateTimeOrDash('2026-12-02T05:51:00Z')).toBe('2026-12-02 05:51 UTC');
  });
});
