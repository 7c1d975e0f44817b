import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { positivePower } from "./positivePower";

// Reference: ECMAScript's own Math.pow (ECMA-262 §21.3.2.26, Number::exponentiate), which the
// engine's curves used before; positivePower is the faster route to the same value.
describe("positivePower", () => {
  it("agrees with Math.pow for bases ≥ 0 to 1e-13 relative (ECMA-262 Number::exponentiate)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e4, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), (x, y) => {
        const want = Math.pow(x, y);
        return Math.abs(positivePower(x, y) - want) <= 1e-13 * Math.abs(want);
      }),
      { numRuns: 5000 },
    );
  });
  it("keeps Math.pow's rules at 0 and y = 1 (ECMA-262 Number::exponentiate)", () => {
    for (const y of [2, 0.6, 0, -0.5]) expect(positivePower(0, y)).toBe(Math.pow(0, y));
    expect(positivePower(0.3, 1)).toBe(0.3);
    expect(positivePower(0.25, 0.5)).toBeCloseTo(0.5, 15);
  });
});
