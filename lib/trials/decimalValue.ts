const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * Decimal text to number, exactly as Number() (decimalValue).
 *
 * Purpose: the trial-table reader converts about 14 fields per movement; for the plain form
 * `[-+]digits[.digits]` with at most 15 significant digits and at most 22 digits after the point
 * this reads the value by hand (no call into the runtime's general string-to-number code), and
 * hands everything else (exponents, spaces, hex, Infinity, empty text, long fields) to Number().
 * Exact: the digits form an integer m < 10^15 < 2^53 (exact in binary64) and 10^k for k ≤ 22 is
 * exact too, so m / 10^k is one correctly rounded division, the same double Number() yields
 * (Clinger, "How to read floating point numbers accurately", PLDI 1990, §"fast path"; IEEE 754
 * binary64). A property test checks it against Number() on random text.
 *
 * Cost: O(length), no allocation.
 * @throws never.
 * @example decimalValue("-12.50") // -12.5
 */
export function decimalValue(s: string): number {
  return decimalRange(s, 0, s.length);
}

/**
 * decimalValue of s.slice(start, end) without making that string (decimalRange): the trial-table
 * reader converts fields in place in the line's text. Exactly Number(s.slice(start, end)).
 *
 * Cost: O(end − start); allocates only when handing over to Number().
 * @throws never.
 * @example decimalRange("a,-12.50,b", 2, 8) // -12.5
 */
export function decimalRange(s: string, start: number, end: number): number {
  const n = end;
  let i = start;
  let negative = false;
  let c = n > start ? s.charCodeAt(start) : 0;
  if (c === 45 || c === 43) {
    negative = c === 45;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let fraction = 0;
  let dot = false;
  let any = false;
  for (; i < n; i++) {
    c = s.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      any = true;
      if (mantissa !== 0 || c !== 48) digits++;
      mantissa = mantissa * 10 + (c - 48);
      if (dot) fraction++;
    } else if (c === 46 && !dot) {
      dot = true;
    } else {
      return Number(s.slice(start, end));
    }
  }
  if (!any || digits > 15 || fraction > 22) return Number(s.slice(start, end));
  const x = mantissa / (POW10[fraction] as number);
  return negative ? -x : x;
}
