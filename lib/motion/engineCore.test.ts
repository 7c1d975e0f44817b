import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseTransferConfig } from "./config";
import { createMotionEngine } from "./engine";
import { createMotionEngineFromValid, sampleIsUsable } from "./engineCore";
import { motionSampleSchema, type MotionSample } from "./sample";

describe("createMotionEngineFromValid", () => {
  it("the schema-free validity check agrees with the zod sample schema (the W3C field rules)", () => {
    const v = fc.oneof(fc.double(), fc.constant(undefined), fc.integer({ min: -3, max: 3 }), fc.constant(0xffffffff + 1));
    fc.assert(
      fc.property(fc.record({ tMs: v, gyroX: v, gyroY: v, gyroZ: v, accelX: v, accelY: v, accelZ: v, stickX: v, stickY: v, buttons: v, pointerDx: v, pointerDy: v, screenAngleDeg: v }, { requiredKeys: [] }), (raw) => {
        const s = raw as unknown as MotionSample;
        return sampleIsUsable(s) === motionSampleSchema.safeParse(s).success;
      }),
      { numRuns: 3000 },
    );
  });

  it("gives the same output as the validating engine, sample for sample", () => {
    const rate = fc.double({ min: -300, max: 300, noNaN: true });
    fc.assert(
      fc.property(fc.array(fc.record({ dt: fc.double({ min: 1, max: 40, noNaN: true }), gx: rate, gy: rate, gz: rate, b: fc.integer({ min: 0, max: 7 }) }), { minLength: 1, maxLength: 60 }), (rows) => {
        const input = { gain: 4, gainCurve: "power" as const, smoothingTimeMs: 40, deadBandDegPerS: 1, addedLatencyMs: 20 };
        const a = createMotionEngine(input), b = createMotionEngineFromValid(parseTransferConfig(input));
        let t = 0;
        for (const r of rows) {
          t += r.dt;
          const s: MotionSample = { tMs: t, gyroX: r.gx, gyroY: r.gy, gyroZ: r.gz, buttons: r.b };
          const oa = a.push(s), ob = b.push(s);
          if (oa?.dx !== ob?.dx || oa?.dy !== ob?.dy || oa?.recentered !== ob?.recentered) return false;
        }
        return a.accepted === b.accepted && a.dropped === b.dropped;
      }),
      { numRuns: 200 },
    );
  });

  it("a left turn of 3° at gain 6 becomes 18° to the left (view mode; the doc example)", () => {
    // science.md §8 "Signs": turning left moves left; CD gain multiplies the rate (common practice)
    const e = createMotionEngineFromValid(parseTransferConfig({ gain: 6 }));
    e.push({ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 });
    expect(e.push({ tMs: 100, gyroX: 0, gyroY: 30, gyroZ: 0 })?.dx).toBeCloseTo(-18, 9);
  });
});
