import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { formatSampleCsv, parseSampleCsv, sampleColumns } from "@/lib/motion/csv";
import type { MotionSample } from "@/lib/motion/sample";
import { sampleStreamCsv } from "@/components/participant/streamCsv";

const n = fc.double({ min: -1e6, max: 1e6, noNaN: true });
const opt = fc.option(n, { nil: undefined });
const sample = fc.record({ tMs: n, gyroX: n, gyroY: n, gyroZ: n, accelX: opt, accelY: opt, accelZ: opt, stickX: opt, stickY: opt, buttons: fc.option(fc.nat(7), { nil: undefined }), pointerDx: opt, pointerDy: opt, screenAngleDeg: fc.option(fc.constantFrom(0, 90, 180, 270), { nil: undefined }) }) as fc.Arbitrary<MotionSample>;

describe("sampleStreamCsv (the page's copy of the replay writer)", () => {
  it("writes exactly what formatSampleCsv writes", () => {
    fc.assert(fc.property(fc.array(sample, { maxLength: 30 }), (samples) => sampleStreamCsv(samples) === formatSampleCsv(samples)), { numRuns: 500 });
  });

  it("starts with the column names of the replay format and reads back", () => {
    // interfaces.md "Raw sensor stream": t_ms,gyro_x,gyro_y,gyro_z first
    const csv = sampleStreamCsv([{ tMs: 0, gyroX: 1, gyroY: 2, gyroZ: 3 }, { tMs: 16.5, gyroX: -1, gyroY: 0, gyroZ: 0.25, pointerDx: 2 }]);
    expect(csv.split("\n")[0]).toBe(sampleColumns.slice(0, 13).join(",")); // with the pointer movement columns
    expect(parseSampleCsv(csv, "s.csv").length).toBe(2);
  });
});
