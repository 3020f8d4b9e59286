/**
 * Numbers in exports are written to a stated number of decimal places per quantity, never with
 * the noise of binary floating point (`41.204450000115116`, `1.2699999999999996`). The rule is
 * the one MariaDB applies to `CAST(x AS DECIMAL(65, d))`: take the shortest decimal that reads
 * back as the same double (what `String(x)` writes), round it half away from zero at `d`
 * places, and drop trailing zeros, so `lib/export/csv-sql.ts` can have the database write the
 * same text (`tests/integration/csv-sql.test.ts` compares the two). docs/methods.md, "Exports",
 * lists the places of every quantity.
 */

/** Decimal places are 1 to 30 (MariaDB's DECIMAL holds at most 30 after the point). */
export function checkDecimals(decimals: number, where: string): number {
  if (!Number.isInteger(decimals) || decimals < 1 || decimals > 30)
    throw new RangeError(`${where}: decimals must be an integer from 1 to 30, got ${decimals}`);
  return decimals;
}

/**
 * `x` rounded half away from zero at `decimals` places of its shortest round-trip decimal,
 * trailing zeros dropped, never in exponent form, never `-0`. Non-finite numbers give the
 * empty string (an empty cell, as {@link csvCell} writes them).
 */
export function formatDecimals(x: number, decimals: number): string {
  checkDecimals(decimals, 'formatDecimals');
  if (!Number.isFinite(x)) return '';
  const m = /^(-?)(\d+)(?:\.(\d+))?(?:e([+-]\d+))?$/.exec(String(x));
  if (!m) throw new RangeError(`formatDecimals: cannot read the digits of ${x}`);
  const [, sign, whole, fraction = '', exp = '0'] = m;
  // All significant digits, and how many of them stand before the decimal point.
  let digits = whole + fraction;
  let point = whole.length + Number(exp);
  const keep = point + decimals;
  if (keep < 0) return '0';
  if (keep < digits.length) {
    const up = digits.charCodeAt(keep) >= 53; // '5'
    digits = digits.slice(0, keep);
    if (up) {
      // Add one in the last kept place, carrying left; a carry out of the first digit adds one.
      const d = digits.split('').map(Number);
      let i = d.length - 1;
      while (i >= 0 && d[i] === 9) d[i--] = 0;
      if (i >= 0) d[i] += 1;
      else {
        d.unshift(1);
        point += 1;
      }
      digits = d.join('');
    }
  }
  if (point <= 0) digits = '0'.repeat(1 - point) + digits;
  else if (digits.length < point) digits += '0'.repeat(point - digits.length);
  const intDigits = Math.max(point, 1);
  const intPart = digits.slice(0, intDigits).replace(/^0+(?=\d)/, '');
  const fracPart = digits.slice(intDigits).replace(/0+$/, '');
  const text = fracPart ? `${intPart}.${fracPart}` : intPart;
  return sign && /[1-9]/.test(text) ? `-${text}` : text;
}
