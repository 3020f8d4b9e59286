import { describe, expect, it } from 'vitest';
import {
  convertPoints,
  kinematicDistances,
  linesReport,
  PastedLinesError,
  readPastedRows,
} from '@/lib/calculators';
import { HttpError } from '@/lib/http/errors';
import { lineMessage } from '@/components/forms/calculator-results';

function thrown(f: () => unknown): unknown {
  try {
    f();
  } catch (e) {
    return e;
  }
  throw new Error('expected a throw');
}

const notNumber = (values: string[]) =>
  values.some((v) => !Number.isFinite(Number(v))) ? 'not a number' : null;

describe('pasted lines: every bad line, first first', () => {
  it('lists a bad value on line 3 before a wrong count on line 5', () => {
    // Lines 1 and 4 are fine, 2 is a comment; 3 has a bad value, 5 has two values of three.
    const text = '10 0 5\n# l b v\n10 x 5\n20 0 5\n30 0\n';
    const e = thrown(() => readPastedRows(text, 3, 3, notNumber));
    expect(e).toBeInstanceOf(PastedLinesError);
    expect((e as PastedLinesError).problems.map((p) => p.line)).toEqual([3, 5]);
    const lines = (e as Error).message.split('\n');
    expect(lines[0]).toBe('Line 3: not a number');
    expect(lines[1]).toMatch(/^Line 5: expected three values \(l, b, v\), found 2/);
  });

  it('lists at most 50 lines and counts the rest', () => {
    const text = Array.from({ length: 60 }, (_, i) => `${i} only`).join('\n');
    const lines = (thrown(() => readPastedRows(text, 3)) as Error).message.split('\n');
    expect(lines).toHaveLength(51); // 50 listed (the cap) + the count line
    expect(lines[0]).toMatch(/^Line 1: /);
    expect(lines[49]).toMatch(/^Line 50: /);
    expect(lines[50]).toBe('and 10 more bad lines.');
  });

  it('sorts problems given out of order', () => {
    expect(
      linesReport([
        { line: 9, reason: 'b' },
        { line: 2, reason: 'a' },
      ]),
    ).toBe('Line 2: a\nLine 9: b');
  });
});

describe('the calculator API: every bad entry', () => {
  it('convert names each bad point with its index', () => {
    const e = thrown(() =>
      convertPoints({
        from: 'galactic',
        points: [
          [10, 0],
          [10, 95],
          [20, 0],
          ['x', 0],
        ],
      }),
    ) as HttpError;
    expect(e).toBeInstanceOf(HttpError);
    expect(e.status).toBe(400);
    expect((e.details as { index: number }[]).map((d) => d.index)).toEqual([1, 3]);
    expect(e.message).toMatch(/^points\[1\]: latitude b 95 .* \(and 1 more bad points\)$/);
  });

  it('kinematic distance names each bad source and lists at most 50', () => {
    const sources = Array.from({ length: 120 }, (_, i) =>
      i % 2 === 0 ? { l: 30, b: 0, v: 50 } : { l: 30, b: 100, v: 50 },
    );
    const e = thrown(() => kinematicDistances({ curve: 'flat', sources })) as HttpError;
    const details = e.details as { index: number }[];
    // 60 bad sources (every odd index): 50 listed (the cap), the message counts the other 59.
    expect(details).toHaveLength(50);
    expect(details[0].index).toBe(1);
    expect(details[49].index).toBe(99);
    expect(e.message).toMatch(/^sources\[1\]: latitude b 100 .* \(and 59 more bad sources\)$/);
  });

  it('the page turns the listed entries into pasted lines and counts the unlisted', () => {
    // Entries 0 and 2 of the request came from pasted lines 4 and 9; the API said 3 were bad.
    const msg = lineMessage(
      'sources[0]: l is missing (and 2 more bad sources)',
      [
        { index: 0, message: 'l is missing' },
        { index: 2, message: 'b "x" is not a finite number' },
      ],
      [4, 6, 9],
    );
    expect(msg).toBe(
      'Line 4: l is missing\nLine 9: b "x" is not a finite number\nand 1 more bad line.',
    );
  });
});
