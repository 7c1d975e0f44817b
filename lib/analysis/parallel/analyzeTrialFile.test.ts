import { createReadStream } from "node:fs";
import { describe, expect, test } from "vitest";
import { TrialTableError } from "../../trials";
import { analyzeTrialStream } from "../analyzeTrialStream";
import { analyzeTrialFile } from "./analyzeTrialFile";

const FIX = "tests/fixtures/analysis/";

describe("analyzeTrialFile in worker threads", () => {
  test("gives the same result as one thread", async () => {
    const one = await analyzeTrialStream(createReadStream(FIX + "good.csv"), { file: "good.csv" });
    const two = await analyzeTrialFile(FIX + "good.csv", { file: "good.csv", threads: 3, parallelFrom: 0 });
    expect(two.sequences).toHaveLength(one.sequences.length);
    two.sequences.forEach((s, i) => expect(s.tp).toBeCloseTo(one.sequences[i]!.tp, 9));
    expect(two.anova[0]!.F).toBeCloseTo(one.anova[0]!.F!, 9);
  }, 30_000);
  test("reports absolute lines from a later chunk", async () => {
    const err = await analyzeTrialFile(FIX + "short-sequence.csv", { file: "s.csv", threads: 3, parallelFrom: 0 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(TrialTableError);
    expect((err as TrialTableError).message).toMatch(/^s\.csv:82:sequence: /);
    const nan = await analyzeTrialFile(FIX + "zero-width.csv", { file: "z.csv", threads: 2, parallelFrom: 0 }).catch((e: unknown) => e);
    expect((nan as TrialTableError).message).toBe("z.csv:6:width: width must be > 0, got 0");
  }, 30_000);
});
