import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";

import { decimalRange, decimalValue } from "./decimalValue";

// Property tests over many random inputs: allow for a busy machine.
vi.setConfig({ testTimeout: 30_000 });

// Reference: the ECMAScript StringToNumber conversion (ECMA-262 §7.1.4.1.1) as the runtime's
// Number() implements it; decimalValue must give the identical double (Object.is, so −0 counts).
describe("decimalValue", () => {
  it("equals Number() on random text made of number characters", () => {
    const chars = fc.constantFrom(..."0123456789.-+e ".split(""), "0", "0", "5", "9");
    fc.assert(
      fc.property(fc.array(chars, { maxLength: 26 }), (cs) => {
        const s = cs.join("");
        expect(Object.is(decimalValue(s), Number(s))).toBe(true);
      }),
      { numRuns: 20000 },
    );
  });
  it("equals Number() on printed doubles (String, toFixed) and plain decimals", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true }), fc.integer({ min: 0, max: 20 }), (v, places) => {
        for (const s of [String(v), Math.abs(v) < 1e21 ? v.toFixed(places) : "1"]) {
          expect(Object.is(decimalValue(s), Number(s))).toBe(true);
        }
      }),
      { numRuns: 20000 },
    );
    fc.assert(
      fc.property(fc.stringMatching(/^[-+]?[0-9]{0,17}(\.[0-9]{0,24})?$/), (s) => {
        expect(Object.is(decimalValue(s), Number(s))).toBe(true);
      }),
      { numRuns: 20000 },
    );
  });
  it("keeps the sign of zero and hands odd forms to Number()", () => {
    // Values from ECMA-262 StringToNumber (from memory): "-0" is −0, "" is 0, "." is NaN.
    expect(Object.is(decimalValue("-0"), -0)).toBe(true);
    expect(decimalValue("")).toBe(0);
    expect(decimalValue(".")).toBeNaN();
    expect(decimalValue("-.")).toBeNaN();
    expect(decimalValue("0x10")).toBe(16);
    expect(decimalValue(" 5")).toBe(5);
    expect(decimalValue("5.")).toBe(5);
    expect(decimalValue("0.1")).toBe(0.1);
  });
});

describe("decimalRange", () => {
  it("reads a field inside a line exactly as Number() reads the field's text", () => {
    const chars = fc.constantFrom(..."0123456789.-+e ".split(""), "0", "5", "é", "x");
    fc.assert(
      fc.property(fc.array(chars, { maxLength: 40 }), fc.array(chars, { maxLength: 5 }), (cs, around) => {
        const s = cs.join("");
        const pad = around.join("");
        const line = `${pad},${s},${pad}`;
        expect(Object.is(decimalRange(line, pad.length + 1, pad.length + 1 + s.length), Number(s))).toBe(true);
      }),
      { numRuns: 20000 },
    );
  });
});
