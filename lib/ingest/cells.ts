/** Sexagesimal angle or time: `18:03:40.2`, `18h03m40.2s`, `-24 22 43`, `-24d22m43s`, `-24°22′43″`. */
const SEXAGESIMAL =
  /^[+-]?\d{1,3}(?:\s*[:hd°\s]\s*)\d{1,2}(?:\s*[:m'′\s]\s*)\d{1,2}(?:\.\d*)?\s*[s"″]?$/i;

/** Text that stands for "no value" in catalogs. */
const MISSING_TOKENS = new Set(['', 'nan', 'null', 'none', 'na', 'n/a', '--', '---', '-', '?']);

/** True when a cell is empty or one of the usual "no value" markers (`NaN`, `null`, `--`, …). */
export function isMissingCell(text: string): boolean {
  return MISSING_TOKENS.has(text.trim().toLowerCase());
}

/**
 * Parses a decimal number cell strictly: surrounding spaces allowed, Fortran `D` exponents
 * (`1.5D+03`) accepted, anything else that is not a finite number (including hex) gives NaN.
 * Empty cells also give NaN; check {@link isMissingCell} to tell them apart.
 */
export function parseNumberCell(text: string): number {
  const x = Number(text);
  if (Number.isFinite(x)) {
    if (x === 0 && text.trim() === '') return NaN;
    const c0 = text.charCodeAt(0);
    if ((c0 === 48 || c0 <= 32) && isRadixLiteral(text)) return NaN;
    return x;
  }
  if (/^\s*[+-]?(?:\d+\.?\d*|\.\d+)[dD][+-]?\d+\s*$/.test(text)) {
    return Number(text.replace(/[dD]/, 'e'));
  }
  return NaN;
}

function isRadixLiteral(text: string): boolean {
  const t = text.trim();
  const c = t.charCodeAt(1) | 0x20;
  return t.charCodeAt(0) === 48 && (c === 0x78 || c === 0x6f || c === 0x62);
}

/** True when a cell reads as a sexagesimal angle or time (see the accepted forms above). */
export function isSexagesimalCell(text: string): boolean {
  return SEXAGESIMAL.test(text.trim());
}

/** True for a cell that is a number or a sexagesimal value (used to tell data rows from headers). */
export function isNumericLikeCell(text: string): boolean {
  return Number.isFinite(parseNumberCell(text)) || isSexagesimalCell(text);
}

/** A number written with a decimal comma: `30,1`, `-0,25`, `1,5e3` (one comma, digits both sides). */
const DECIMAL_COMMA = /^\s*[+-]?\d+,\d+(?:[eE][+-]?\d+)?\s*$/;

/** True when a cell is a number written with a decimal comma (see {@link parseDecimalCommaCell}). */
export function isDecimalCommaCell(text: string): boolean {
  return DECIMAL_COMMA.test(text);
}

/**
 * Like {@link parseNumberCell}, but a cell such as `30,1` reads as 30.1. Used only when the
 * uploader chose to read decimal commas; cells with a point still read as before.
 */
export function parseDecimalCommaCell(text: string): number {
  return DECIMAL_COMMA.test(text) ? Number(text.replace(',', '.')) : parseNumberCell(text);
}
