import { parse } from "csv-parse/sync";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { formatSampleCsv, parseSampleCsv, sampleColumns, sampleFromTable, SampleCsvError } from "./csv";
import type { MotionSample } from "./sample";

const header = "t_ms,gyro_x,gyro_y,gyro_z,accel_x,accel_y,accel_z,stick_x,stick_y,buttons,screen_angle";

describe("sample stream CSV (interfaces.md format)", () => {
  it("the fast scanner reads the same numbers as csv-parse + Number (reference: csv-parse, RFC 4180)", () => {
    const num = fc.oneof(fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((x) => String(x)), fc.integer({ min: -99999, max: 99999 }).map((x) => (x / 1000).toFixed(3)), fc.constant("-0.5"), fc.constant("1e-3"), fc.constant(" 2.5 "));
    fc.assert(
      fc.property(fc.array(fc.tuple(num, num, num), { minLength: 1, maxLength: 20 }), (rows) => {
        const text = "t_ms,gyro_x,gyro_y,gyro_z\n" + rows.map((r, i) => `${i},${r.join(",")}`).join("\n") + "\n";
        const table = parseSampleCsv(text, "x.csv");
        const reference = parse(text, { from_line: 2 }) as string[][];
        return reference.every((rec, i) => [1, 2, 3].every((k) => Object.is(table.columns[sampleColumns[k]!][i], Number(rec[k]!.trim()))));
      }),
      { numRuns: 300 },
    );
  });
  it("refuses a lone sign or point as a number, as Number() does (ECMAScript StringToNumber)", () => {
    for (const v of ["-.", "+.", ".", "-", "+"]) {
      expect(() => parseSampleCsv(`t_ms,gyro_x,gyro_y,gyro_z\n0,${v},2,3\n`, "s.csv"), v).toThrow(/s\.csv:2:gyro_x: /);
    }
    expect(parseSampleCsv("t_ms,gyro_x,gyro_y,gyro_z\n0,-0,.5,5.\n", "s.csv").columns.gyro_y[0]).toBe(0.5);
  });
  it("reads quoted files through csv-parse", () => {
    const t = parseSampleCsv('"t_ms","gyro_x","gyro_y","gyro_z"\r\n"0","1.5","2","3"\r\n"10","4","5","6"\r\n', "q.csv");
    expect(t.length).toBe(2);
    expect(t.columns.gyro_x[0]).toBe(1.5);
    expect(t.columns.t_ms[1]).toBe(10);
  });
  it("leaves empty optional fields undefined and round-trips through formatSampleCsv", () => {
    const samples: MotionSample[] = [
      { tMs: 0, gyroX: 1, gyroY: -2.25, gyroZ: 3, screenAngleDeg: 0 },
      { tMs: 16.7, gyroX: 0.1, gyroY: 0, gyroZ: 0, accelX: 0, accelY: 9.8, accelZ: 0.2, stickX: -0.5, stickY: 1, buttons: 5, screenAngleDeg: 90 },
    ];
    const t = parseSampleCsv(formatSampleCsv(samples), "r.csv");
    const back = [0, 1].map((i) => ({ ...sampleFromTable(t, i, { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }) }));
    expect(back[0]).toMatchObject({ tMs: 0, gyroX: 1, gyroY: -2.25, accelX: undefined, buttons: undefined });
    expect(back[1]).toMatchObject(samples[1]!);
  });
  const bad = (text: string) => {
    try {
      parseSampleCsv(text, "s.csv");
    } catch (e) {
      if (e instanceof SampleCsvError) return e.message;
      throw e;
    }
    return "no error";
  };
  it("names file, line and column for bad input", () => {
    expect(bad(`${header}\n0,0,0,0,,,,,,,0\n10,0,abc,0,,,,,,,0\n`)).toBe("s.csv:3:gyro_y: not a number");
    expect(bad(`${header}\n0,0,0,0,,,,,,,0\n10,0,,0,,,,,,,0\n`)).toBe("s.csv:3:gyro_y: empty");
    expect(bad(`${header}\n0,0,0,0,1,,,,,,0\n`)).toBe("s.csv:2:accel_y: empty while another acceleration field is given");
    expect(bad(`${header}\n0,0,0,0,,,,2,,,0\n`)).toBe("s.csv:2:stick_x: outside -1..1");
    expect(bad(`${header}\n0,0,0,0,,,,,,1.5,0\n`)).toBe("s.csv:2:buttons: not a non-negative integer bitmask");
    expect(bad(`${header}\n5,0,0,0,,,,,,,0\n4,0,0,0,,,,,,,0\n`)).toBe("s.csv:3:t_ms: time goes backwards");
    expect(bad(`${header}\n0,0,0\n`)).toBe("s.csv:2:gyro_z: missing field");
    expect(bad("t_ms,gyro_x,gyro_y\n0,0,0\n")).toBe("s.csv:1:gyro_z: missing column");
    expect(bad("")).toBe("s.csv:1:t_ms: empty file");
    expect(bad(`${header}\n0,Infinity,0,0,,,,,,,0\n`)).toBe("s.csv:2:gyro_x: not a number");
  });
  it("the project's optional columns: written only when a stream has them, read back, checked the same in plain and quoted files", () => {
    const samples: MotionSample[] = [
      { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0, pointerX: 12.5, pointerY: -3, selected: 0 },
      { tMs: 8, gyroX: 0, gyroY: 0, gyroZ: 0, pointerDx: 2, pointerDy: -1, selected: 1 },
    ];
    const text = formatSampleCsv(samples);
    expect(text.split("\n")[0]).toBe(`${header},pointer_dx,pointer_dy,pointer_x,pointer_y,selected`);
    const t = parseSampleCsv(text, "p.csv");
    expect(sampleFromTable(t, 0, { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 })).toMatchObject({ pointerX: 12.5, pointerY: -3, pointerDx: undefined, selected: 0 });
    expect(sampleFromTable(t, 1, { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 })).toMatchObject({ pointerX: undefined, pointerDx: 2, selected: 1 });
    const quote = (csv: string) => csv.split("\n").map((l) => (l ? l.split(",").map((f) => `"${f}"`).join(",") : l)).join("\n");
    for (const [csv, message] of [
      ["t_ms,gyro_x,gyro_y,gyro_z,pointer_x,pointer_y\n0,0,0,0,,4\n", "s.csv:2:pointer_x: empty while the other pointer position is given"],
      ["t_ms,gyro_x,gyro_y,gyro_z,selected\n0,0,0,0,0.5\n", "s.csv:2:selected: not 0 or 1"],
    ] as const) {
      expect(bad(csv)).toBe(message);
      expect(bad(quote(csv))).toBe(message);
    }
  });
});
