import { Readable } from "node:stream";
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { readTrialTable, toTrialCsv, TrialTableError, trialRowSchema, type TrialRow } from "./index";

const coord = fc.double({ min: -1e4, max: 1e4, noNaN: true, noDefaultInfinity: true });
const code = fc.stringMatching(/^[A-Za-z0-9 ,"_-]{1,8}$/).filter((s) => s.trim() === s && s.length > 0);
const rowArb: fc.Arbitrary<TrialRow> = fc.record({
  participant: code,
  condition: code,
  block: fc.integer({ min: 0, max: 9 }),
  sequence: fc.integer({ min: 0, max: 99 }),
  trial: fc.integer({ min: 1, max: 25 }),
  amplitude: fc.double({ min: 1, max: 2000, noNaN: true }),
  width: fc.double({ min: 0.1, max: 200, noNaN: true }),
  timeMs: fc.double({ min: 0, max: 1e4, noNaN: true }),
  hit: fc.boolean(),
  factors: fc.constant({ technique: "motion", gain: "4" }),
  fromX: coord, fromY: coord, toX: coord, toY: coord, startX: coord, startY: coord, endX: coord, endY: coord,
});

const read = (text: string) => readTrialTable(Readable.from([text]), { file: "t.csv" });

describe("trial table round trip", () => {
  test("toTrialCsv then readTrialTable gives the rows back, and zod's trialRowSchema accepts them (property)", async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(rowArb, { minLength: 1, maxLength: 8 }), async (rows) => {
        const back = await read(toTrialCsv(rows));
        // a label that begins with "-" comes back with the single quote that keeps spreadsheets from reading a formula (lib/csv)
        const text = (v: string) => (v.startsWith("-") ? `'${v}` : v);
        expect(back.map(({ line: _line, ...r }) => r)).toEqual(rows.map((r) => ({ ...r, participant: text(r.participant), condition: text(r.condition), timeMs: r.timeMs + 0, fromX: r.fromX + 0, fromY: r.fromY + 0, toX: r.toX + 0, toY: r.toY + 0, startX: r.startX + 0, startY: r.startY + 0, endX: r.endX + 0, endY: r.endY + 0 })));
        for (const r of back) expect(trialRowSchema.safeParse(r).success).toBe(true);
        expect(back.map((r) => r.line)).toEqual(rows.map((_, i) => i + 2));
      }),
      { numRuns: 50 },
    );
  });
  test("f_ columns become factors; unknown extra columns are ignored", async () => {
    const text =
      "note,participant,condition,block,sequence,trial,amplitude,width,from_x,from_y,to_x,to_y,start_x,start_y,end_x,end_y,time_ms,hit,f_gain\n" +
      "x,P1,A,1,1,1,100,10,0,0,100,0,1,0,101,2,500,1,6\n";
    const [row] = await read(text);
    expect(row!.factors).toEqual({ gain: "6" });
    expect(row!.endX).toBe(101);
    expect(row!.hit).toBe(true);
    expect(row!.timedOut).toBeUndefined();
  });
  test("the optional movement flags (interfaces.md: timed_out, recentered, clutched, 1 or 0) are read when present and written back", async () => {
    const text =
      "participant,condition,block,sequence,trial,amplitude,width,from_x,from_y,to_x,to_y,start_x,start_y,end_x,end_y,time_ms,hit,timed_out,recentered,clutched\n" +
      "P1,A,1,1,1,100,10,0,0,100,0,1,0,101,2,10000,0,1,0,1\n";
    const rows = await read(text);
    expect(rows[0]).toMatchObject({ timedOut: true, recentered: false, clutched: true });
    expect(toTrialCsv(rows.map(({ line: _line, ...r }) => r))).toBe(text);
    await expect(read(text.replace(",0,1,0,1\n", ",0,2,0,1\n"))).rejects.toThrow('t.csv:2:timed_out: must be 0 or 1, got "2"');
  });
});

describe("bad input names file, line and column", () => {
  const header = "participant,condition,block,sequence,trial,amplitude,width,from_x,from_y,to_x,to_y,start_x,start_y,end_x,end_y,time_ms,hit";
  const good = "P1,A,1,1,1,100,10,0,0,100,0,1,0,101,2,500,1";
  const cases: [string, string, string][] = [
    ["empty file", "", "t.csv:1:(header): empty file, expected a header row"],
    ["header only", header + "\n", "t.csv:2:(row): the table has no movements"],
    ["missing column", header.replace(",hit", "") + "\n" + good.slice(0, -2) + "\n", 't.csv:1:hit: missing column "hit"'],
    ["non-number", header + "\n" + good + "\n" + good.replace(",500,", ",fast,") + "\n", 't.csv:3:time_ms: not a number: "fast"'],
    ["empty number", header + "\n" + good.replace(",100,10,", ",,10,") + "\n", 't.csv:2:amplitude: not a number: ""'],
    ["W ≤ 0", header + "\n" + good.replace(",100,10,", ",100,-1,") + "\n", "t.csv:2:width: width must be > 0, got -1"],
    ["hit not 0/1", header + "\n" + good.replace(/,1$/, ",2") + "\n", 't.csv:2:hit: hit must be 0 or 1, got "2"'],
    ["trial 0", header + "\n" + good.replace("P1,A,1,1,1,", "P1,A,1,1,0,") + "\n", "t.csv:2:trial: trial must be ≥ 1, got 0"],
    ["too few fields", header + "\n" + good + "\n" + good.replace(/,1$/, "") + "\n", "t.csv:3:hit: expected 17 fields, got 16"],
  ];
  test.each(cases)("%s", async (_name, text, message) => {
    const err = await read(text).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(TrialTableError);
    expect((err as TrialTableError).message).toBe(message);
  });
});
