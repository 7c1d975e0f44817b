import { describe, expect, it } from "vitest";
import { defaultTransferConfig } from "../config";
import { createMotionEngine } from "../engine";
import { aboutVertical, totalOutput, upright, virtualDeviceSamples } from "../testing/virtualDevice";
import { speedAfterDeadBand } from "./deadBand";
import { exponentialSmoothingFactor, fineAimDirectWeight } from "./fineAimSmoothing";
import { gainAtSpeed } from "./gainAtSpeed";
import { powerGainFactor } from "./powerGainFactor";
import { twoLevelGainFactor } from "./twoLevelGainFactor";

const turn = (deg: number, ms = 500) => virtualDeviceSamples((t) => aboutVertical(deg * Math.min(1, t / ms)).multiply(upright()), ms, 100);

describe("CD gain (common practice figures)", () => {
  it("gain 6 turns a 30° device turn into a 180° view turn", () => {
    expect(totalOutput(createMotionEngine({ gain: 6 }).push, turn(30)).x).toBeCloseTo(-180, 6);
  });
  it("gain 1 is 1:1", () => {
    expect(totalOutput(createMotionEngine({ gain: 1 }).push, turn(30)).x).toBeCloseTo(-30, 6);
  });
  it("cursor mode multiplies by pixels per degree and keeps page y down", () => {
    const e = createMotionEngine({ gain: 2, displayMode: "cursor", pixelsPerDegree: 15 });
    expect(totalOutput(e.push, turn(10)).x).toBeCloseTo(-300, 6);
    const up = [{ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }, { tMs: 100, gyroX: -10, gyroY: 0, gyroZ: 0 }]; // top edge tilted away: up
    expect(totalOutput(createMotionEngine({ displayMode: "cursor", pixelsPerDegree: 15 }).push, up).y).toBeCloseTo(-15, 9);
  });
  it("horizontal and vertical multipliers are separate", () => {
    const s = [{ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }, { tMs: 100, gyroX: -10, gyroY: -10, gyroZ: 0 }];
    const out = totalOutput(createMotionEngine({ gain: 2, horizontalGainMultiplier: 1.5, verticalGainMultiplier: 0.5 }).push, s);
    expect(out.x).toBeCloseTo(3, 9); // 2 × 1.5 × 10 deg/s × 0.1 s, a right turn
    expect(out.y).toBeCloseTo(1, 9);
  });
});

describe("gain curves", () => {
  it("two-level: slow factor below, 1 above, continuous at both edges (Casiez & Roussel 2011: speed-dependent gain)", () => {
    expect(twoLevelGainFactor(0, 5, 30, 0.4)).toBe(0.4);
    expect(twoLevelGainFactor(5 + 1e-9, 5, 30, 0.4)).toBeCloseTo(0.4, 8);
    expect(twoLevelGainFactor(30 - 1e-9, 5, 30, 0.4)).toBeCloseTo(1, 8);
    expect(twoLevelGainFactor(100, 5, 30, 0.4)).toBe(1);
    expect(twoLevelGainFactor(17.5, 5, 30, 0.4)).toBeCloseTo(0.7, 12);
  });
  it("power: output speed ∝ speed^p, so doubling the speed multiplies the output by 2^p", () => {
    const c = { ...defaultTransferConfig, gainCurve: "power" as const, curveExponent: 1.8, curveReferenceSpeedDegPerS: 20, gain: 3 };
    const out = (s: number) => gainAtSpeed(c, s) * s;
    expect(out(20)).toBeCloseTo(60, 9); // at the reference speed the gain is the nominal gain
    expect(out(10) / out(5)).toBeCloseTo(2 ** 1.8, 9);
    expect(powerGainFactor(7.5, 30, 2)).toBeCloseTo(0.25, 12);
  });
  it("a two-level curve reduces small rotations at high gain (common practice: fine control at high gain)", () => {
    const slow = [{ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }, { tMs: 100, gyroX: 0, gyroY: 2, gyroZ: 0 }];
    const constant = totalOutput(createMotionEngine({ gain: 6 }).push, slow).x;
    const curved = totalOutput(createMotionEngine({ gain: 6, gainCurve: "two-level", curveSlowGainFactor: 0.25 }).push, slow).x;
    expect(curved).toBeCloseTo(constant * 0.25, 9);
  });
});

describe("dead band and fine-aim smoothing", () => {
  it("dead band: zero below, continuous above", () => {
    expect(speedAfterDeadBand(1.9, 2)).toBe(0);
    expect(speedAfterDeadBand(2 + 1e-9, 2)).toBeCloseTo(0, 8);
    expect(speedAfterDeadBand(12, 2)).toBe(10);
  });
  it("the engine drops rotation inside the dead band", () => {
    const s = [{ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }, { tMs: 100, gyroX: 0, gyroY: 1.5, gyroZ: 0 }];
    expect(totalOutput(createMotionEngine({ deadBandDegPerS: 2 }).push, s).x).toBe(0);
  });
  it("smoothing factor of a first-order low-pass: α = Δt/(τ + Δt) (discretised RC filter)", () => {
    expect(exponentialSmoothingFactor(10, 30)).toBeCloseTo(0.25, 12);
    expect(exponentialSmoothingFactor(10, 0)).toBe(1);
    expect(fineAimDirectWeight(2.5, 10)).toBe(0.25);
    expect(fineAimDirectWeight(50, 10)).toBe(1);
  });
  it("fine-aim smoothing leaves fast input unchanged and delays slow input", () => {
    const steps = (rate: number) => [0, 10, 20, 30].map((t, i) => ({ tMs: t, gyroX: 0, gyroY: i === 0 ? 0 : rate, gyroZ: 0 }));
    const cfg = { smoothingTimeMs: 50, smoothingSpeedDegPerS: 10 };
    expect(totalOutput(createMotionEngine(cfg).push, steps(40)).x).toBeCloseTo(totalOutput(createMotionEngine({}).push, steps(40)).x, 12);
    const slowSmoothed = totalOutput(createMotionEngine(cfg).push, steps(3)).x;
    const slowRaw = totalOutput(createMotionEngine({}).push, steps(3)).x;
    expect(Math.abs(slowSmoothed)).toBeLessThan(Math.abs(slowRaw));
    expect(Math.abs(slowSmoothed)).toBeGreaterThan(0);
  });
});
