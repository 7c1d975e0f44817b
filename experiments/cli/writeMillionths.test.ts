import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { writeMillionths, writeNumberText } from "./writeMillionths";

// Reference: JavaScript's own Number::toString (ECMA-262 §6.1.6.1.20), the replay CLI's output
// format: String(Math.round(v·1e6)/1e6) for positions, String(v) for t_ms.
const reference = (v: number) => String(Math.round(v * 1e6) / 1e6);
const buf = Buffer.alloc(128);
const millionths = (v: number) => buf.toString("latin1", 0, writeMillionths(buf, 0, v));
const numberText = (v: number) => buf.toString("latin1", 0, writeNumberText(buf, 0, v));

describe("writeMillionths writes the bytes of String(Math.round(v·1e6)/1e6)", () => {
  test("on any double (property)", () => {
    fc.assert(fc.property(fc.double(), (v) => millionths(v) === reference(v)), { numRuns: 20_000 });
  });
  test("on replay-sized values: pixels and degrees with up to 9 decimals (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: -1e12, max: 1e12 }), fc.integer({ min: 0, max: 9 }), (m, d) => millionths(m / 10 ** d) === reference(m / 10 ** d)),
      { numRuns: 20_000 },
    );
  });
  test("edge cases", () => {
    const cases = [0, -0, 1e-6, -1e-6, 4e-7, 5e-7, -5e-7, 0.1 + 0.2, 1 / 3, -2 / 3, 123456.0000005, 999999999.9999994, 999999999.9999996, 1e9, -1e9, 2147.483647, 2147.483648, 2147483647.5, 4294967296.000001, 1e15, 2 ** 53, NaN, Infinity, -Infinity, 0.00001, 10.5, -18, 1e21, 5e-324];
    for (const v of cases) expect(millionths(v)).toBe(reference(v));
    expect(millionths(-12.3456789)).toBe("-12.345679");
  });
});

describe("writeNumberText writes the bytes of String(v)", () => {
  test("on any double and any safe integer (property)", () => {
    fc.assert(fc.property(fc.double(), (v) => numberText(v) === String(v)), { numRuns: 20_000 });
    fc.assert(fc.property(fc.maxSafeInteger(), (v) => numberText(v) === String(v)), { numRuns: 20_000 });
  });
  test("edge cases", () => {
    const cases = [0, -0, 1, 9, 10, 2147483647, 2147483648, 999999999, 1000000000, 1e15, 2 ** 53 - 1, 2 ** 53, 1e21, -4, 0.5, NaN, Infinity];
    for (const v of cases) expect(numberText(v)).toBe(String(v));
  });
});
