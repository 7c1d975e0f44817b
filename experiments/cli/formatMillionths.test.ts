import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { formatMillionths } from "./formatMillionths";

// Reference: JavaScript's own Number::toString (ECMA-262 §6.1.6.1.20) of the value rounded to
// millionths, the replay CLI's output format before this formatter.
const reference = (v: number) => String(Math.round(v * 1e6) / 1e6);

describe("formatMillionths equals String(Math.round(v·1e6)/1e6)", () => {
  test("on any double (property)", () => {
    fc.assert(
      fc.property(fc.double(), (v) => formatMillionths(v) === reference(v)),
      { numRuns: 20_000 },
    );
  });
  test("on replay-sized values: pixels and degrees with up to 9 decimals (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: -1e12, max: 1e12 }), fc.integer({ min: 0, max: 9 }), (m, d) => formatMillionths(m / 10 ** d) === reference(m / 10 ** d)),
      { numRuns: 20_000 },
    );
  });
  test("edge cases", () => {
    const cases = [0, -0, 1e-6, -1e-6, 4e-7, 5e-7, -5e-7, 0.1 + 0.2, 1 / 3, -2 / 3, 123456.0000005, 999999999.9999994, 999999999.9999996, 1e9, -1e9, 1e15, 2 ** 53, NaN, Infinity, -Infinity, 0.000010, 10.5, -18, 1e21, 5e-324];
    for (const v of cases) expect(formatMillionths(v)).toBe(reference(v));
    expect(formatMillionths(-12.3456789)).toBe("-12.345679");
  });
});
