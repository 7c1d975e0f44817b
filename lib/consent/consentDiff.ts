import { diffLines } from "diff";

export type DiffPart = { kind: "same" | "added" | "removed"; text: string };

/**
 * Line diff of two consent versions (consentDiff), for the reviewer and the researcher.
 *
 * Source: the `diff` package (Myers 1986, "An O(ND) difference algorithm"). Cost: O((n + m)·d).
 * @throws never.
 * @example consentDiff("a\nb\n", "a\nc\n") // [{kind:"same",text:"a\n"},{kind:"removed",text:"b\n"},{kind:"added",text:"c\n"}]
 */
export function consentDiff(before: string, after: string): DiffPart[] {
  return diffLines(before, after).map((p) => ({ kind: p.added ? "added" : p.removed ? "removed" : "same", text: p.value }));
}
