import { describe, expect, it } from 'vitest';
import { optionalQueryNumber, queryNumber, queryPaging } from '@/lib/schemas/query';
import { plainText } from '@/lib/schemas/text';
import { analysisSchema } from '@/lib/schemas/analyses';
import { rowsQuerySchema } from '@/lib/services/catalog-rows';
import { updateProjectSchema } from '@/lib/services/projects';

describe('strict decimal query numbers', () => {
  it('reads plain decimals as written', () => {
    // expected values: the decimal literal itself
    expect(queryNumber.parse('16')).toBe(16);
    expect(queryNumber.parse('-12.5')).toBe(-12.5);
    expect(queryNumber.parse('.5')).toBe(0.5);
    expect(queryNumber.parse('1.2e-3')).toBe(0.0012);
    expect(optionalQueryNumber.parse('')).toBeUndefined();
    expect(optionalQueryNumber.parse(undefined)).toBeUndefined();
  });

  it('refuses what Number() would bend into a number', () => {
    for (const s of ['0x10', '0b1', '0o7', ' 1', '1 ', 'Infinity', '1e999', '1,5', '+', '.', '1_0'])
      expect(queryNumber.safeParse(s).success, s).toBe(false);
    expect(queryPaging(1, 500, 50).safeParse('0x10').success).toBe(false);
    expect(queryPaging(1, 500, 50).safeParse('2.5').success).toBe(false);
    expect(queryPaging(1, 500, 50).parse(undefined)).toBe(50);
  });

  it('is what the rows query uses', () => {
    const rows = rowsQuerySchema.safeParse({ lMin: '0x10' });
    expect(rows.success).toBe(false);
    expect(rows.error?.issues[0].path).toEqual(['lMin']);
    expect(rowsQuerySchema.parse({ lMin: '16', page: '3' })).toMatchObject({ lMin: 16, page: 3 });
  });
});

describe('plain text fields', () => {
  const name = plainText({ max: 20 });
  const note = plainText({ max: 20, multiline: true });
  it('refuses NUL and other control characters, naming none of the text', () => {
    for (const s of ['X\0Y', 'a\u0007b', 'a\u001bb', 'a\u007fb', 'a\u0085b', 'a\u202eb', 'a\nb'])
      expect(name.safeParse(s).success, JSON.stringify(s)).toBe(false);
    expect(note.safeParse('X\0Y').success).toBe(false);
  });
  it('keeps ordinary text, and line breaks and tabs in notes', () => {
    expect(name.parse('  NGC 628 – arm 2 ')).toBe('NGC 628 – arm 2');
    expect(note.parse('line 1\nline 2\tend')).toBe('line 1\nline 2\tend');
    expect(name.safeParse('x'.repeat(21)).success).toBe(false);
  });
  it('guards the project name and the project settings', () => {
    const bad = updateProjectSchema.safeParse({ name: 'X\0Y' });
    expect(bad.error?.issues[0].path).toEqual(['name']);
    const huge = updateProjectSchema.safeParse({ settings: { s: 'x'.repeat(70_000) } });
    expect(huge.error?.issues[0].path).toEqual(['settings']);
    expect(updateProjectSchema.safeParse({ settings: { s: 'x'.repeat(60_000) } }).success).toBe(
      true,
    );
  });
});

describe('arm presets are own keys only', () => {
  const body = (preset: string) => ({ runId: 'r', curve: { name: 'flat' }, arms: { preset } });
  it('refuses keys that live on Object.prototype', () => {
    for (const k of ['__proto__', 'constructor', 'toString', 'hasOwnProperty']) {
      const r = analysisSchema.safeParse(body(k));
      expect(r.success, k).toBe(false);
      expect(r.error?.issues.some((i) => i.path.join('.') === 'arms.preset')).toBe(true);
    }
  });
  it('accepts a real preset', () => {
    expect(analysisSchema.safeParse(body('reid-2014')).success).toBe(true); // lib/astro/arms.ts key
  });
});
