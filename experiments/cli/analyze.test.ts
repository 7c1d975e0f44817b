import { spawnSync } from "node:child_process";
import { describe, expect, test, vi } from "vitest";

// Each test starts the CLI in a process of its own, as `npm run analyze` starts it (node and the
// launcher run.mjs, which runs a bundle built once, not tsx and npx on every start): allow for a
// busy machine all the same.
vi.setConfig({ testTimeout: 60_000 });

const FIX = "tests/fixtures/analysis/";
function run(...args: string[]) {
  const r = spawnSync(process.execPath, ["--no-warnings", "experiments/cli/run.mjs", "analyze", ...args], { encoding: "utf8" });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("analyze CLI: bad input → exit 2, one stderr line FILE:LINE:COLUMN, nothing on stdout", () => {
  const cases: [string, RegExp][] = [
    ["missing-column.csv", /^tests\/fixtures\/analysis\/missing-column\.csv:1:hit: missing column "hit"\n$/],
    ["not-a-number.csv", /^tests\/fixtures\/analysis\/not-a-number\.csv:4:from_y: not a number: "abc"\n$/],
    ["empty.csv", /^tests\/fixtures\/analysis\/empty\.csv:1:\(header\): empty file/],
    ["short-sequence.csv", /^tests\/fixtures\/analysis\/short-sequence\.csv:82:sequence: sequence 99 .* at least 2 are needed\n$/],
    ["zero-width.csv", /^tests\/fixtures\/analysis\/zero-width\.csv:6:width: width must be > 0, got 0\n$/],
    ["between-changes.csv", /^tests\/fixtures\/analysis\/between-changes\.csv:7:b_group: participant P01 is in level "novice" of between factor group on line 2, "gamer" here/],
    ["between-one-level.csv", /^tests\/fixtures\/analysis\/between-one-level\.csv:1:b_group: between factor group has a single level \("novice"\)/],
    ["between-empty.csv", /^tests\/fixtures\/analysis\/between-empty\.csv:12:b_group: empty: the participant is in no group/],
  ];
  test.each(cases)("%s", (file, pattern) => {
    const r = run(FIX + file, "--json");
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toMatch(pattern);
    expect(r.stderr.trimEnd().split("\n")).toHaveLength(1);
  });
  test("a file that does not exist", () => {
    const r = run(FIX + "nope.csv");
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toMatch(/nope\.csv:1:\(file\): cannot read/);
  });
});

describe("analyze CLI: JSON follows the contract", () => {
  test("top-level keys and row shapes", () => {
    const r = run(FIX + "good.csv", "--json", "--start", "nominal", "--exclude", "none", "--unit", "mm");
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout);
    const contract = ["unit", "start", "exclude", "excluded", "sequences", "cells", "conditions", "regression", "anova", "posthoc"];
    expect(Object.keys(j).slice(0, contract.length)).toEqual(contract);
    expect([j.unit, j.start, j.exclude, j.excluded]).toEqual(["mm", "nominal", "none", 0]);
    for (const k of ["participant", "condition", "block", "sequence", "amplitude", "width", "n", "errorRate", "ae", "sdx", "we", "ide", "mt", "tp"]) {
      expect(typeof j.sequences[0][k]).toBe(["participant", "condition"].includes(k) ? "string" : "number");
    }
    expect(Object.keys(j.cells[0])).toEqual(expect.arrayContaining(["participant", "condition", "tp", "mt", "errorRate", "we", "ide"]));
    expect(Object.keys(j.conditions[0].tp)).toEqual(["mean", "sd", "ci95"]);
    expect(j.conditions[0].ci95).toBeUndefined();
    expect(Object.keys(j.regression[0])).toEqual(expect.arrayContaining(["condition", "intercept", "slope", "r2"]));
    expect(Object.keys(j.anova[0]).slice(0, 8)).toEqual(["effect", "df1", "df2", "F", "p", "epsilonGG", "pGG", "partialEta2"]);
    expect(j.anova.map((a: { effect: string }) => a.effect)).toEqual(["condition", "technique"]);
    expect(Object.keys(j.posthoc[0]).slice(0, 8)).toEqual(["a", "b", "meanDiff", "t", "df", "p", "pHolm", "dz"]);
    // 4 participants × 2 conditions × 2 widths × 1 sequence of 5 movements.
    expect(j.sequences).toHaveLength(16);
    expect(j.sequences[0].n).toBe(5);
  });
  test("readable tables without --json", () => {
    const r = run(FIX + "good.csv");
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/ANOVA on TP/);
    expect(r.stdout).toMatch(/motion-4/);
  });
  test("a mixed design (b_group) with a time-out: between rows, groups and the counts per rule", () => {
    const r = run(FIX + "mixed.csv", "--json", "--exclude", "misfire+mt3sd");
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.exclude).toBe("misfire+mt3sd");
    expect(j.anova.map((a: { effect: string }) => a.effect)).toEqual(["condition", "technique", "group", "technique:group"]);
    expect(j.exclusions).toEqual({ timed_out: 0, recentered: 0, clutched: 0, misfire: 0, mt3sd: 0 });
    expect(j.timeoutsKept).toBe(1);
    expect(j.groups.factors).toEqual(["group"]);
    const dropped = JSON.parse(run(FIX + "mixed.csv", "--json", "--drop-flagged", "timed_out").stdout);
    expect(dropped.exclusions.timed_out).toBe(1);
    expect(dropped.excluded).toBe(1);
  });
  test("bad option value → exit 2", () => {
    const r = run(FIX + "good.csv", "--start", "sideways");
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
  });
});
