/**
 * Write a number rounded to millionths into a byte buffer (writeMillionths).
 *
 * Purpose: the replay CLI prints two such numbers per sample; writing their ASCII digits straight
 * into one output Buffer avoids building two million strings. The bytes are exactly those of
 * formatMillionths(v), i.e. `String(Math.round(v * 1e6) / 1e6)` (see formatMillionths.ts for why
 * printing n = Math.round(v·10⁶) with a hand-placed decimal point is exact for |n| < 10¹⁵);
 * anything else (|n| ≥ 10¹⁵, NaN, ±Infinity) is written from String.
 * Source: ECMA-262 Number::toString; IEEE 754-2019 binary64. Cost: O(digits), no allocation on
 * the fast path.
 * @throws never; the caller leaves at least 64 free bytes after `at`.
 * @example const b = Buffer.alloc(64); b.toString("latin1", 0, writeMillionths(b, 0, -12.3456789)) // "-12.345679"
 */
export function writeMillionths(buf: Uint8Array, at: number, v: number): number {
  const n = Math.round(v * 1e6);
  if (!(n < 1e15 && n > -1e15)) return writeAscii(buf, at, String(n / 1e6));
  if (n === 0) {
    buf[at] = 48;
    return at + 1;
  }
  let a = n;
  if (n < 0) {
    buf[at++] = 45;
    a = -n;
  }
  // whole = ⌊a / 10⁶⌋ exactly: a < 10¹⁵ is an integer, so a / 10⁶ is at least 10⁻⁶ below the next
  // integer while its rounding error is below 2⁻²³ (half an ulp under 10⁹); the rest is exact.
  const whole = Math.floor(a / 1e6);
  let fraction = (a - whole * 1e6) | 0;
  at = writeDigits(buf, at, whole);
  if (fraction === 0) return at;
  let places = 6;
  let q = (fraction / 10) | 0;
  while (fraction === q * 10) {
    fraction = q;
    q = (fraction / 10) | 0;
    places--;
  }
  buf[at] = 46;
  // the fraction's `places` digits, leading zeros included, right to left
  for (let i = at + places; i > at; i--) {
    q = (fraction / 10) | 0;
    buf[i] = 48 + fraction - q * 10;
    fraction = q;
  }
  return at + places + 1;
}

/**
 * Write a number as String(v) prints it (writeNumberText): non-negative safe integers digit by
 * digit, anything else from String. Cost: O(digits). @throws never.
 * @example const b = Buffer.alloc(64); b.toString("latin1", 0, writeNumberText(b, 0, 1204)) // "1204"
 */
export function writeNumberText(buf: Uint8Array, at: number, v: number): number {
  if (v >= 0 && v <= 9007199254740991 && Math.floor(v) === v) return writeDigits(buf, at, v);
  return writeAscii(buf, at, String(v));
}

/** Decimal digits of a non-negative integer below 2^53, no leading zeros ("0" for 0). */
function writeDigits(buf: Uint8Array, at: number, w: number): number {
  if (w > 2147483647) {
    // exact: w / 10⁹ < 2^24 lies at least 10⁻⁹ from the next integer, its rounding error ≤ 2⁻³⁰
    const high = Math.floor(w / 1e9);
    at = writeDigits(buf, at, high);
    return writeNineDigits(buf, at, (w - high * 1e9) | 0);
  }
  let u = w | 0;
  let len = 1;
  for (let p = 10; p <= u; p *= 10) len++;
  let i = at + len - 1;
  do {
    const q = (u / 10) | 0;
    buf[i--] = 48 + u - q * 10;
    u = q;
  } while (u !== 0);
  return at + len;
}

/** Exactly nine digits (leading zeros kept) of 0 ≤ u < 10⁹. */
function writeNineDigits(buf: Uint8Array, at: number, u: number): number {
  for (let i = at + 8; i >= at; i--) {
    const q = (u / 10) | 0;
    buf[i] = 48 + u - q * 10;
    u = q;
  }
  return at + 9;
}

function writeAscii(buf: Uint8Array, at: number, text: string): number {
  for (let i = 0; i < text.length; i++) buf[at++] = text.charCodeAt(i);
  return at;
}
