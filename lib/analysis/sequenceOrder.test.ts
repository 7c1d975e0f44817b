import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compareSequences, sequenceOrder } from "./summarizeSequences";

// sequenceOrder is a faster way to the order compareSequences defines (the collator's natural order
// of codes); checked against sorting with compareSequences itself, including codes the collator
// holds equal (ICU with numeric collation: "P01" = "P1"; "é" composed = "e" + combining accent).
describe("sequenceOrder", () => {
  it("orders exactly as sorting with compareSequences, ties included", () => {
    const code = fc.constantFrom("P1", "P01", "P2", "P10", "p1", "é", "e\u0301", "A", "a-2", "a-10", "B");
    const info = fc.record({ participant: code, condition: code, block: fc.integer({ min: 1, max: 3 }), sequence: fc.integer({ min: 1, max: 3 }) });
    fc.assert(
      fc.property(fc.array(info, { maxLength: 60 }), (infos) => {
        const expected = [...infos.keys()].sort((a, b) => compareSequences(infos[a]!, infos[b]!));
        expect(sequenceOrder(infos)).toEqual(expected);
      }),
      { numRuns: 2000 },
    );
  });
});
