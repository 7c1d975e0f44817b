import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { transferConfigSchema, type TransferConfigInput } from "./config";
import { createMotionEngine } from "./engine";
import { adaptiveFrameHorizontal } from "./frames/adaptiveFrame";
import { isValidSample, motionSampleSchema, type MotionSample } from "./sample";

const rate = fc.double({ min: -500, max: 500, noNaN: true });
const accel = fc.double({ min: -15, max: 15, noNaN: true });

/** A stream of valid samples 1–40 ms apart. */
const stream = (buttons: fc.Arbitrary<number>) =>
  fc.array(fc.record({ dt: fc.double({ min: 1, max: 40, noNaN: true }), gx: rate, gy: rate, gz: rate, ax: accel, ay: accel, az: accel, sx: fc.double({ min: -1, max: 1, noNaN: true }), sy: fc.double({ min: -1, max: 1, noNaN: true }), b: buttons }), { minLength: 1, maxLength: 80 })
    .map((rows) => {
      let t = 0;
      return rows.map((r): MotionSample => {
        t += r.dt;
        return { tMs: t, gyroX: r.gx, gyroY: r.gy, gyroZ: r.gz, accelX: r.ax, accelY: r.ay, accelZ: r.az, stickX: r.sx, stickY: r.sy, buttons: r.b };
      });
    });

const motionConfig: fc.Arbitrary<TransferConfigInput> = fc.record({
  technique: fc.constantFrom("motion" as const, "tilt-rate" as const),
  frame: fc.constantFrom("device" as const, "gravity" as const, "adaptive" as const),
  deviceHorizontalAxis: fc.constantFrom("screen-normal" as const, "screen-up" as const, "both" as const),
  gain: fc.double({ min: 0.1, max: 20, noNaN: true }),
  gainCurve: fc.constantFrom("constant" as const, "two-level" as const, "power" as const),
  smoothingTimeMs: fc.constantFrom(0, 20, 80),
  deadBandDegPerS: fc.constantFrom(0, 1, 5),
  addedLatencyMs: fc.constantFrom(0, 16, 100),
  displayMode: fc.constantFrom("view" as const, "cursor" as const),
});

describe("engine properties (fast-check)", () => {
  it("clutch held → no movement, for any motion configuration and stream", () => {
    fc.assert(
      fc.property(motionConfig, stream(fc.constant(1)), (cfg, samples) => {
        const e = createMotionEngine({ ...cfg, clutchButton: 0, clutchMode: "hold" });
        for (const s of samples) {
          const o = e.push(s)!;
          if (o.dx !== 0 || o.dy !== 0) return false;
        }
        return true;
      }),
    );
  });

  it("activation while aiming: no movement unless the aim button is held", () => {
    fc.assert(
      fc.property(motionConfig, stream(fc.constantFrom(0, 1, 4)), (cfg, samples) => {
        const e = createMotionEngine({ ...cfg, activation: "while-aiming", aimButton: 3, addedLatencyMs: 0 });
        return samples.every((s) => {
          const o = e.push(s)!;
          return o.dx === 0 && o.dy === 0;
        });
      }),
    );
  });

  it("the adaptive frame never exceeds the magnitude of its inputs (Cauchy–Schwarz)", () => {
    fc.assert(
      fc.property(rate, rate, fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), (wy, wz, gy, gz) => {
        return Math.abs(adaptiveFrameHorizontal(wy, wz, gy, gz)) <= Math.hypot(wy, wz) * (1 + 1e-12) + 1e-12;
      }),
    );
  });

  it("added latency of N ms delays the output by N ms", () => {
    fc.assert(
      fc.property(motionConfig, stream(fc.constant(0)), fc.integer({ min: 1, max: 300 }), (cfg, samples, n) => {
        const base = { ...cfg, addedLatencyMs: 0 };
        const plain = createMotionEngine(base), late = createMotionEngine({ ...base, addedLatencyMs: n });
        // cumulative output of the plain engine, by sample time
        const times: number[] = [], cumX: number[] = [], cumY: number[] = [];
        let px = 0, py = 0, lx = 0, ly = 0;
        for (const s of samples) {
          const a = plain.push(s)!;
          px += a.dx;
          py += a.dy;
          times.push(s.tMs);
          cumX.push(px);
          cumY.push(py);
          const b = late.push(s)!;
          lx += b.dx;
          ly += b.dy;
          // the delayed total at t equals the plain total at the last sample time ≤ t − N
          let j = -1;
          for (let i = 0; i < times.length; i++) if ((times[i] as number) + n <= s.tMs) j = i;
          const ex = j < 0 ? 0 : (cumX[j] as number), ey = j < 0 ? 0 : (cumY[j] as number);
          const tol = 1e-9 * (1 + Math.abs(ex) + Math.abs(ey));
          if (Math.abs(lx - ex) > tol || Math.abs(ly - ey) > tol) return false;
        }
        return true;
      }),
    );
  });

  it("a bad sample is dropped and counted, and the state is unchanged", () => {
    const bad = fc.constantFrom<Partial<MotionSample>>({ gyroX: NaN }, { gyroY: Infinity }, { tMs: -Infinity }, { accelX: undefined }, { stickX: 3 }, { buttons: 1.5 }, { gyroZ: undefined as unknown as number });
    fc.assert(
      fc.property(motionConfig, stream(fc.constantFrom(0, 4)), fc.nat(), bad, (cfg, samples, at, broken) => {
        const i = at % samples.length;
        const a = createMotionEngine(cfg), b = createMotionEngine(cfg);
        const outA: number[] = [], outB: number[] = [];
        samples.forEach((s, k) => {
          if (k === i) {
            const r = b.push({ ...s, ...broken });
            if (r !== null) outB.push(NaN);
          }
          const oa = a.push(s)!, ob = b.push(s)!;
          outA.push(oa.dx, oa.dy);
          outB.push(ob.dx, ob.dy);
        });
        return b.dropped === 1 && a.dropped === 0 && outA.every((v, k) => Object.is(v, outB[k]) || v === outB[k]);
      }),
    );
  });

  it("a sample whose time goes backwards is dropped", () => {
    const e = createMotionEngine({});
    e.push({ tMs: 100, gyroX: 0, gyroY: 0, gyroZ: 0 });
    expect(e.push({ tMs: 50, gyroX: 0, gyroY: 10, gyroZ: 0 })).toBeNull();
    expect(e.dropped).toBe(1);
    expect(e.accepted).toBe(1);
  });

  it("the hot-path validity check agrees with the zod sample schema", () => {
    const v = fc.oneof(fc.double(), fc.constant(undefined), fc.integer({ min: -3, max: 3 }));
    fc.assert(
      fc.property(fc.record({ tMs: v, gyroX: v, gyroY: v, gyroZ: v, accelX: v, accelY: v, accelZ: v, stickX: v, stickY: v, buttons: v, screenAngleDeg: v }, { requiredKeys: [] }), (raw) => {
        const s = raw as unknown as MotionSample;
        return isValidSample(s) === motionSampleSchema.safeParse(s).success;
      }),
      { numRuns: 2000 },
    );
  });
});

describe("clutch, activation and recenter", () => {
  const s = (t: number, buttons: number) => ({ tMs: t, gyroX: 0, gyroY: 10, gyroZ: 0, buttons });
  it("toggle clutch: a press suspends motion until the next press", () => {
    const e = createMotionEngine({ clutchMode: "toggle", clutchButton: 0 });
    e.push(s(0, 0));
    expect(e.push(s(100, 1))!.dx).toBe(0);
    expect(e.push(s(200, 0))!.dx).toBe(0);
    expect(e.push(s(300, 1))!.dx).not.toBe(0);
    expect(e.push(s(400, 0))!.dx).not.toBe(0);
  });
  it("the orientation keeps being tracked while clutched", () => {
    const e = createMotionEngine({ frame: "gravity", gravityFilterTimeMs: 10_000 });
    e.push({ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0, accelX: 0, accelY: 9.8, accelZ: 0, buttons: 1 });
    for (let t = 10; t <= 1000; t += 10) e.push({ tMs: t, gyroX: 30, gyroY: 0, gyroZ: 0, accelX: 0, accelY: 9.8, accelZ: 0, buttons: 1 });
    const up = { x: 0, y: 0, z: 0 };
    e.readUp(up);
    expect(up.z).toBeCloseTo(-Math.sin(Math.PI / 6), 1); // top edge tilted 30° towards the viewer: the screen faces down by 30°
  });
  it("recenter is reported once per press", () => {
    const e = createMotionEngine({ recenterButton: 2 });
    expect(e.push(s(0, 4))!.recentered).toBe(true);
    expect(e.push(s(10, 4))!.recentered).toBe(false);
    expect(e.push(s(20, 0))!.recentered).toBe(false);
    expect(e.push(s(30, 4))!.recentered).toBe(true);
  });
  it("a long gap between samples is capped at maxSampleGapMs", () => {
    const e = createMotionEngine({ maxSampleGapMs: 50 });
    e.push(s(0, 0));
    expect(e.push(s(5000, 0))!.dx).toBeCloseTo(-0.5, 12);
  });
  it("motion+touch adds the touch drag (view degrees per pixel); drag up looks up", () => {
    const e = createMotionEngine({ technique: "motion+touch", pointerDegreesPerPixel: 0.2 });
    e.push(s(0, 0));
    const o = e.push({ tMs: 100, gyroX: 0, gyroY: 0, gyroZ: 0, pointerDx: 10, pointerDy: -5 })!;
    expect(o.dx).toBeCloseTo(2, 12);
    expect(o.dy).toBeCloseTo(1, 12);
  });
  it("tilt-rate: tilting the right edge down turns right at a rate, none inside the dead zone", () => {
    const e = createMotionEngine({ technique: "tilt-rate", tiltDeadZoneDeg: 5, tiltMaxDeg: 30, tiltMaxRateDegPerS: 120, gravityFilterTimeMs: 0 });
    const g = (deg: number) => ({ accelX: -9.8 * Math.sin((deg * Math.PI) / 180), accelY: 9.8 * Math.cos((deg * Math.PI) / 180), accelZ: 0 });
    e.push({ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0, ...g(0) });
    expect(e.push({ tMs: 100, gyroX: 0, gyroY: 0, gyroZ: 0, ...g(4) })!.dx).toBe(0);
    expect(e.push({ tMs: 200, gyroX: 0, gyroY: 0, gyroZ: 0, ...g(30) })!.dx).toBeCloseTo(12, 6);
  });
  it("schema defaults are what the engine uses", () => {
    expect(createMotionEngine({}).config).toEqual(transferConfigSchema.parse({}));
  });
});
