/**
 * Numbers in query strings. `Number()` (and so `z.coerce.number()`) reads `0x10` as 16, `1e3`
 * as 1000, `''` and `' '` as 0 and `Infinity` as a number; a filter must mean what it says, so
 * only plain decimals pass: an optional sign, digits, an optional fraction and exponent.
 */
import { z } from 'zod';

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const INTEGER = /^[+-]?\d+$/;

/** A decimal number written the plain way (`-12.5`, `3`, `1.2e-3`), as a finite number. */
export const queryNumber = z
  .string()
  .regex(DECIMAL, 'Give a plain decimal number (digits, an optional point and exponent).')
  .transform(Number)
  .pipe(z.number().finite());

/** A whole number written in decimal digits only. */
export const queryInteger = z
  .string()
  .regex(INTEGER, 'Give a whole number in decimal digits.')
  .transform(Number)
  .pipe(z.number().int().safe());

/** An optional filter: absent or empty (`lMin=`) means "any". */
export const optionalQueryNumber = z
  .literal('')
  .transform(() => undefined)
  .or(queryNumber)
  .optional();

/** A page number or size: decimal digits in [min, max], `fallback` when absent. */
export const queryPaging = (min: number, max: number, fallback: number) =>
  queryInteger.pipe(z.number().min(min).max(max)).default(fallback);
