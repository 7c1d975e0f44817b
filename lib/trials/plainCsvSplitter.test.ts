import { Readable } from "node:stream";
import fc from "fast-check";
import { describe, expect, test, vi } from "vitest";
import { readTrialTable } from "./readTrialTable";
import { TRIAL_COLUMNS } from "./columns";

// Property tests over many random tables: allow for a busy machine.
vi.setConfig({ testTimeout: 30_000 });

// Reference: csv-parse (npm, RFC 4180 parser) through the same row checks. The fast path must give
// exactly what it gives: the same rows with the same lines, or the same error message.
const settle = async (p: Promise<unknown>) => {
  try {
    return { ok: await p };
  } catch (err) {
    return { error: (err as Error).message };
  }
};
const read = (bytes: Buffer, cuts: number[], parser: "auto" | "csv-parse") => {
  const pieces: Buffer[] = [];
  let at = 0;
  for (const c of [...new Set(cuts.map((x) => Math.floor(x * bytes.length)))].sort((a, b) => a - b)) {
    if (c > at) pieces.push(bytes.subarray(at, c));
    at = Math.max(at, c);
  }
  pieces.push(bytes.subarray(at));
  return settle(readTrialTable(Readable.from(pieces), { file: "t.csv", parser }));
};

const number = fc.oneof(
  fc.integer({ min: -500, max: 500 }).map(String),
  fc.double({ min: -1e4, max: 1e4, noNaN: true }).map(String),
  fc.constantFrom("1e2", " 7 ", "0x10", "-0", "1.50"),
);
const positive = fc.oneof(fc.integer({ min: 1, max: 900 }).map(String), fc.constantFrom("2.5", "1e1"));
const code = fc.constantFrom("P01", "P02", "motion-4", "stick 2", "ü", "x y");
const cell = (column: string) => {
  if (column === "participant" || column === "condition") return code;
  if (column === "block" || column === "sequence") return fc.constantFrom("1", "2", " 3");
  if (column === "trial") return fc.constantFrom("1", "2", "3");
  if (column === "amplitude" || column === "width" || column === "time_ms") return positive;
  if (column === "hit") return fc.constantFrom("0", "1", "1", " 1");
  if (column.startsWith("f_")) return fc.constantFrom("a", "b");
  return number;
};

const tableArb = fc
  .record({
    extra: fc.subarray(["note", "f_gain", "f_technique", "comment"]),
    shuffle: fc.boolean(),
    rows: fc.integer({ min: 0, max: 12 }),
    seed: fc.integer(),
    eol: fc.constantFrom("\n", "\r\n"),
    bom: fc.boolean(),
    finalEol: fc.constantFrom("", "eol", "eol+blank", "eol+cr"),
    // per-row disturbances: a field count off by one, a quoted field, a blank line, a stray CR,
    // a bad value (not a number, empty, hit 2, W 0, trial 0, block 1.5)
    disturb: fc.array(
      fc.constantFrom(...Array<string>(24).fill("none"), "short", "long", "quote", "quote-comma", "blank", "cr", "abc", "", "2", "0", "1.5"),
      { maxLength: 12 },
    ),
    badColumn: fc.constantFrom("participant", "block", "trial", "width", "hit", "end_y", "f_gain"),
    cuts: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 6 }),
  })
  .chain((t) => {
    const columns = [...TRIAL_COLUMNS, ...t.extra];
    if (t.shuffle) columns.reverse();
    return fc.array(fc.tuple(...columns.map(cell)), { minLength: t.rows, maxLength: t.rows }).map((rows) => ({ ...t, columns, rows }));
  });

type Table = typeof tableArb extends fc.Arbitrary<infer T> ? T : never;

function render(t: Table): Buffer {
  const lines = [t.columns.join(",")];
  t.rows.forEach((fields, i) => {
    const f = [...fields];
    const d = t.disturb[i] ?? "none";
    if (d === "short") f.pop();
    if (d === "long") f.push("9");
    if (d === "quote") f[0] = `"${f[0]}"`;
    if (d === "quote-comma") f[1] = `"${f[1]},x"`;
    if (d === "blank") lines.push("");
    if (d === "cr") f[2] = `${f[2]}\r`;
    if (["abc", "", "2", "0", "1.5"].includes(d) && t.columns.indexOf(t.badColumn) >= 0) f[t.columns.indexOf(t.badColumn)] = d;
    lines.push(f.join(","));
  });
  let text = lines.join(t.eol);
  if (t.finalEol !== "") text += t.eol;
  if (t.finalEol === "eol+blank") text += t.eol;
  if (t.finalEol === "eol+cr") text += "\r";
  return Buffer.concat([t.bom ? Buffer.from([0xef, 0xbb, 0xbf]) : Buffer.alloc(0), Buffer.from(text, "utf8")]);
}

const outcomes = { rows: 0, error: 0 };

describe("plain-CSV fast path yields exactly what csv-parse yields", () => {
  test("rows, lines and error messages on random tables, cut into random chunks (property)", async () => {
    await fc.assert(
      fc.asyncProperty(tableArb, async (t) => {
        const bytes = render(t);
        const fast = await read(bytes, t.cuts, "auto");
        const reference = await read(bytes, [], "csv-parse");
        expect(fast).toEqual(reference);
        outcomes[reference.ok ? "rows" : "error"]++;
      }),
      { numRuns: 600 },
    );
    // Both outcomes must be well represented, or the comparison says little.
    expect(outcomes.rows).toBeGreaterThan(100);
    expect(outcomes.error).toBeGreaterThan(100);
  });
  test("edge cases: empty input, a BOM alone, blank lines only, a lone CR line ending, a UTF-16 BOM", async () => {
    const inputs = ["", "\ufeff", "\n\n", "\r\n", TRIAL_COLUMNS.join(",") + "\r1,2\r", "\ufeff" + TRIAL_COLUMNS.join(",")];
    for (const text of inputs) expect(await read(Buffer.from(text), [0.5], "auto")).toEqual(await read(Buffer.from(text), [], "csv-parse"));
    const utf16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(TRIAL_COLUMNS.join(",") + "\n", "utf16le")]);
    expect(await read(utf16, [], "auto")).toEqual(await read(utf16, [], "csv-parse"));
  });
  test("a valid table is read in full by the fast path (the reference agrees and has rows)", async () => {
    const row = "P1,A,1,1,1,100,10,0,0,100,0,1,0,101,2,500,1";
    const text = TRIAL_COLUMNS.join(",") + "\r\n" + row + "\r\n" + row.replace(",1,1,1,", ",1,1,2,") + "\r\n";
    const fast = await read(Buffer.from(text), [0.3, 0.31], "auto");
    expect(fast).toEqual(await read(Buffer.from(text), [], "csv-parse"));
    expect((fast.ok as unknown[]).length).toBe(2);
  });
});
