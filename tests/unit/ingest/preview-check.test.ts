import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mappingAssumptions } from '@/lib/ingest/assumptions';
import { mappingSchema } from '@/lib/ingest/mapping';
import { isRejection, makeRowNormaliser } from '@/lib/ingest/normalise';
import { previewBadCells } from '@/lib/ingest/preview-check';
import type { TableHeader } from '@/lib/ingest/types';

const header: TableHeader = {
  format: 'delimited',
  delimiter: ',',
  columns: ['glon', 'glat', 'vlsr', 'size', 'name'].map((name) => ({ name })),
  headerLine: 1,
};
const mapping = mappingSchema.parse({
  position: {
    system: 'galactic',
    lon: { column: 'glon', unit: 'deg' },
    lat: { column: 'glat', unit: 'deg' },
  },
  velocity: { column: 'vlsr', unit: 'km/s', frame: 'lsr', convention: 'radio' },
  size: { column: 'size', unit: 'arcsec', kind: 'diameter' },
});
const good = ['12.5', '0.3', '40', '20', 'A'];
/** Cells each rule rejects (not a number, |b| > 90°, negative size, missing required value). */
const BAD: Record<number, string[]> = {
  0: ['abc', '', '1e999'],
  1: ['95', 'x', ''],
  2: ['fast', '400000'],
  3: ['-1', 'big'],
};

describe('bad cells in the preview', () => {
  it('marks every bad cell of a row, where the ingest reports only the first', () => {
    const row = ['abc', '95', '40', '-3', 'A'];
    const r = previewBadCells(header, mapping, [row, good]);
    expect(r).toEqual({
      cells: [
        { rowIndex: 0, column: 0, reason: 'field `glon` value `abc`: not a number' },
        { rowIndex: 0, column: 1, reason: 'field `glat` value `95`: |b| must be ≤ 90°' },
        { rowIndex: 0, column: 3, reason: 'field `size` value `-3`: angular size must be ≥ 0' },
      ],
    });
    const normalise = makeRowNormaliser(header, mapping);
    const first = normalise(row, 2, 1);
    expect(isRejection(first) && first.reason).toBe('field `glon` value `abc`: not a number');
  });

  it('agrees with the row normaliser cell by cell (brute force over single and double faults)', () => {
    const normalise = makeRowNormaliser(header, mapping);
    const cellArb = fc.record({
      column: fc.constantFrom(0, 1, 2, 3),
      pick: fc.nat(),
    });
    fc.assert(
      fc.property(fc.array(cellArb, { minLength: 0, maxLength: 3 }), (faults) => {
        const row = [...good];
        const bad = new Set<number>();
        for (const f of faults) {
          const options = BAD[f.column];
          row[f.column] = options[f.pick % options.length];
          bad.add(f.column);
        }
        const r = previewBadCells(header, mapping, [row]);
        if (!('cells' in r)) return false;
        const marked = r.cells.map((c) => c.column).sort();
        // Oracle: a cell is bad exactly when the good row with only that cell changed is rejected.
        const oracle = [...bad]
          .filter((k) => {
            const single = [...good];
            single[k] = row[k];
            return isRejection(normalise(single, 2, 1));
          })
          .sort();
        expect(marked).toEqual(oracle);
        expect(isRejection(normalise(row, 2, 1))).toBe(oracle.length > 0);
        return true;
      }),
      { numRuns: 200 },
    );
  });

  it('a wrong field count marks the row, and a missing column is a problem, not a crash', () => {
    expect(previewBadCells(header, mapping, [['1', '2']])).toEqual({
      cells: [
        {
          rowIndex: 0,
          column: -1,
          reason: 'too few fields: expected 5 (as in the header), found 2',
        },
      ],
    });
    const other = mappingSchema.parse({
      ...mapping,
      position: { ...mapping.position, lon: { column: 'ra', unit: 'deg' } },
    });
    const r = previewBadCells(header, other, [good]);
    expect('problem' in r && r.problem).toMatch(/column `ra`, which the file does not have/);
  });

  it('decimal commas: the same cells are bad without the option and fine with it', () => {
    const row = ['12,5', '0,3', '40', '20', 'A'];
    const plain = previewBadCells(header, mapping, [row]);
    expect('cells' in plain && plain.cells.map((c) => c.column)).toEqual([0, 1]);
    expect(previewBadCells(header, mapping, [row], { decimalComma: true })).toEqual({ cells: [] });
  });
});

describe('assumptions of a mapping', () => {
  it('says a size is read as a diameter, which units were assumed, and what is missing', () => {
    const withUnits: TableHeader = {
      ...header,
      columns: [{ name: 'glon' }, { name: 'glat' }, { name: 'vlsr [km/s]' }, { name: 'size' }],
    };
    const m = mappingSchema.parse({
      ...mapping,
      velocity: { ...mapping.velocity, column: 'vlsr [km/s]' },
    });
    const a = mappingAssumptions(withUnits, m, { decimalComma: true });
    expect(a).toContain(
      'Size from `size` in arcsec (the file does not state a unit; assumed), read as a diameter (halved to the stored radius).',
    );
    expect(a).toContain(
      'Velocity from `vlsr [km/s]` in km/s: already LSR (kept as is); radio convention (kept as is).',
    );
    expect(a).toContain('No velocity-error column: velocity errors are left empty.');
    expect(a).toContain('No line-width column: sources have no line width.');
    expect(a).toContain('No distance column: no independent distances are stored.');
    expect(a).toContain(
      'Numbers written with a decimal comma (30,1) are read as decimal points (30.1).',
    );
    const radius = mappingAssumptions(withUnits, {
      ...m,
      size: { column: 'size', unit: 'arcsec', kind: 'radius' },
    });
    expect(radius.some((s) => /read as a radius \(kept as is\)/.test(s))).toBe(true);
    expect(radius.some((s) => /decimal comma/.test(s))).toBe(false);
  });

  it('equatorial input is stated as J2000 rotated to Galactic; heliocentric optical velocities as converted', () => {
    const eq = mappingSchema.parse({
      position: {
        system: 'equatorial',
        lon: { column: 'glon', unit: 'hours' },
        lat: { column: 'glat', unit: 'deg' },
      },
      velocity: { column: 'vlsr', unit: 'km/s', frame: 'heliocentric', convention: 'optical' },
    });
    const a = mappingAssumptions(header, eq);
    expect(a[0]).toMatch(/taken as J2000 \(ICRS\) equatorial coordinates and rotated to Galactic/);
    expect(a[1]).toMatch(
      /heliocentric, shifted to the LSR .*optical convention, converted exactly/,
    );
  });
});
