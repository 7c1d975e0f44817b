import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseSampleCsv, SampleCsvError } from "./csv";

// Reference: ECMAScript StringToNumber (ECMA-262 §7.1.4.1.1, what Number() does) on the trimmed
// field, as interfaces.md's format reads it: empty → empty field, non-finite → "not a number".
const referenceValue = (raw: string): number | "not a number" => {
  const s = raw.trim();
  if (s === "") return NaN;
  const x = Number(s);
  return Number.isFinite(x) ? x : "not a number";
};

// Fields built from the characters the plain scanner branches on: signs, digits, points, spaces,
// exponents and a few others; long digit runs cross the 15-significant-digit limit.
const fieldChar = fc.constantFrom("0", "1", "5", "9", "0", "7", ".", "-", "+", " ", "e", "x", "N", "\t");
const field = fc.oneof(
  fc.array(fieldChar, { maxLength: 6 }).map((cs) => cs.join("")),
  fc.tuple(fc.constantFrom("", "-", "+"), fc.stringMatching(/^[0-9]{1,20}$/), fc.constantFrom("", "."), fc.stringMatching(/^[0-9]{0,24}$/)).map((p) => p.join("")),
  fc.double({ noNaN: true }).map(String),
);

describe("plain-file field scanner agrees with Number() on every field shape", () => {
  it("values, empty fields and errors, LF and CRLF, with an ignored extra column (property)", () => {
    fc.assert(
      fc.property(field, field, fc.boolean(), (a, b, crlf) => {
        const eol = crlf ? "\r\n" : "\n";
        const text = `t_ms,gyro_x,note,gyro_y,gyro_z${eol}0,1,x,2,3${eol}4,${a},${b},${b},5${eol}`;
        const ra = referenceValue(a), rb = referenceValue(b);
        let got: number[] | string;
        try {
          const t = parseSampleCsv(text, "f.csv");
          got = [t.columns.gyro_x[1] as number, t.columns.gyro_y[1] as number];
        } catch (error) {
          if (!(error instanceof SampleCsvError)) throw error;
          got = error.message;
        }
        // the first failing field in row order names the column (the ignored "note" never fails)
        if (ra === "not a number") return got === "f.csv:3:gyro_x: not a number";
        if (rb === "not a number") return got === "f.csv:3:gyro_y: not a number";
        if (Number.isNaN(ra)) return got === "f.csv:3:gyro_x: empty";
        if (Number.isNaN(rb)) return got === "f.csv:3:gyro_y: empty";
        return Array.isArray(got) && Object.is(got[0], ra) && Object.is(got[1], rb);
      }),
      { numRuns: 5_000 },
    );
  });
  it("a field at the line end, an empty last field and a row with too many fields", () => {
    expect(parseSampleCsv("t_ms,gyro_x,gyro_y,gyro_z,buttons\n0,1,2,-3.25,\n", "g.csv").columns.gyro_z[0]).toBe(-3.25);
    expect(Number.isNaN(parseSampleCsv("t_ms,gyro_x,gyro_y,gyro_z,buttons\n0,1,2,3,\n", "g.csv").columns.buttons[0])).toBe(true);
    expect(() => parseSampleCsv("t_ms,gyro_x,gyro_y,gyro_z\n0,1,2,3,4\n", "g.csv")).toThrow("g.csv:2:(row): more than 4 fields");
  });
});
