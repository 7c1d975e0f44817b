/**
 * Number rounded to millionths, as text (formatMillionths).
 *
 * Purpose: the replay CLI prints two such numbers per sample (a million samples: two million
 * numbers); this gives exactly `String(Math.round(v * 1e6) / 1e6)` about 3× faster by printing the
 * integer n = Math.round(v·10⁶) with the decimal point put in by hand. Exact because for |n| < 10¹⁵
 * the decimal n·10⁻⁶ has at most 15 significant digits, so it is the only decimal of that length or
 * shorter that converts to the double n / 10⁶ (15 = DBL_DIG, IEEE 754 binary64), which makes it the
 * shortest round-trip form that Number::toString prints (ECMA-262 §6.1.6.1.20), in fixed notation
 * since 10⁻⁶ ≤ |n / 10⁶| < 10⁹. Anything else (|n| ≥ 10¹⁵, NaN, ±Infinity) goes through String.
 * Source: ECMA-262 Number::toString; IEEE 754-2019 binary64. Cost: O(1).
 * @throws never.
 * @example formatMillionths(-12.3456789) // "-12.345679"
 */
export function formatMillionths(v: number): string {
  const n = Math.round(v * 1e6);
  if (!(n < 1e15 && n > -1e15)) return String(n / 1e6);
  if (n === 0) return "0";
  const a = n < 0 ? -n : n;
  const fraction = a % 1e6;
  const whole = (a - fraction) / 1e6;
  const sign = n < 0 ? "-" : "";
  if (fraction === 0) return sign + whole;
  let digits = fraction;
  let places = 6;
  while (digits % 10 === 0) {
    digits /= 10;
    places--;
  }
  const text = "" + digits;
  return sign + whole + "." + "00000".slice(0, places - text.length) + text;
}
