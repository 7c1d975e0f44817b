import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { jsonPieces } from "./writeJson";

// Reference: the runtime's own JSON.stringify (ECMA-262 §25.5.2), including what it leaves out
// (undefined, functions) and writes as null (undefined array elements, NaN, ±Infinity).
const written = (value: unknown, chunk: number) => [...jsonPieces(value, chunk)].join("");

describe("jsonPieces", () => {
  it("writes exactly JSON.stringify(value), whatever the chunk size (property)", () => {
    const leaf = fc.oneof(fc.jsonValue(), fc.constant(undefined), fc.constant(Number.NaN), fc.constant(Number.NEGATIVE_INFINITY), fc.constant(() => 1));
    const value = fc.oneof(
      fc.dictionary(fc.string(), fc.oneof(leaf, fc.array(leaf, { maxLength: 30 }))),
      fc.array(leaf),
      leaf,
    );
    fc.assert(
      fc.property(value, fc.integer({ min: 1, max: 7 }), (v, chunk) => {
        expect(written(v, chunk)).toBe(JSON.stringify(v) ?? "");
      }),
      { numRuns: 3000 },
    );
  });
  it("an object with toJSON (a Date) is written as JSON.stringify writes it", () => {
    const v = { when: new Date(0), list: [new Date(1), 2, 3] };
    expect(written(v, 1)).toBe(JSON.stringify(v));
    expect(written(new Date(5), 1)).toBe(JSON.stringify(new Date(5)));
  });
});
