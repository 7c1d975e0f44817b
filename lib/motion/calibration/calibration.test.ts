import { mean, sampleStandardDeviation } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { createSeededRandom } from "../simulate/prng";
import { aboutDevice, aboutVertical, upright, virtualDeviceSamples } from "../testing/virtualDevice";
import type { MotionSample } from "../sample";
import { estimateBiasAtRest } from "./biasAtRest";
import { checkGyroUnits } from "./gyroUnitCheck";
import { sampleRateReport } from "./sampleRateReport";

const rng = createSeededRandom(42);
const still = (ms: number, bias: [number, number, number], sd: number, t0 = 0): MotionSample[] =>
  Array.from({ length: Math.round(ms / 10) + 1 }, (_, k) => ({
    tMs: t0 + k * 10,
    gyroX: bias[0] + sd * rng.normal(), gyroY: bias[1] + sd * rng.normal(), gyroZ: bias[2] + sd * rng.normal(),
    accelX: 0.02 * rng.normal(), accelY: 9.8 + 0.02 * rng.normal(), accelZ: 0.02 * rng.normal(),
  }));

describe("bias at rest (science.md §8: mean ω over ≥ 1 s at rest, with the residual noise SD)", () => {
  it("recovers a known bias within 4 standard errors and the noise SD within 15 %", () => {
    const samples = still(1500, [0.4, -0.25, 0.1], 0.12);
    const b = estimateBiasAtRest(samples);
    const se = 0.12 / Math.sqrt(samples.length);
    expect(Math.abs(b.biasXDegPerS - 0.4)).toBeLessThan(4 * se);
    expect(Math.abs(b.biasYDegPerS + 0.25)).toBeLessThan(4 * se);
    expect(Math.abs(b.noiseSdXDegPerS / 0.12 - 1)).toBeLessThan(0.15);
    // agrees with simple-statistics on the same span
    expect(b.biasZDegPerS).toBeCloseTo(mean(samples.map((s) => s.gyroZ)), 12);
    expect(b.noiseSdZDegPerS).toBeCloseTo(sampleStandardDeviation(samples.map((s) => s.gyroZ)), 12);
  });
  it("finds the still span inside a stream that moves before and after", () => {
    const move = (t0: number) => virtualDeviceSamples((t) => aboutVertical(60 * Math.sin(t / 100)).multiply(upright()), 500, 100).map((s) => ({ ...s, tMs: s.tMs + t0 }));
    const samples = [...move(0), ...still(1200, [1, 1, 1], 0.05, 600), ...move(1900)];
    const b = estimateBiasAtRest(samples);
    expect(b.fromMs).toBeGreaterThanOrEqual(600);
    expect(b.toMs).toBeLessThanOrEqual(1900); // the next movement starts from rest at 1900
    expect(b.biasXDegPerS).toBeCloseTo(1, 1);
  });
  it("refuses when the device is never still for 1 s, judged by the accelerometer too", () => {
    const shaken = still(2000, [0, 0, 0], 0.05).map((s, k) => ({ ...s, accelX: k % 50 === 0 ? 3 : 0 }));
    expect(() => estimateBiasAtRest(shaken)).toThrow(/requires at least 1000 ms of still samples \(longest still span: \d+ ms\)/);
  });
});

describe("sample rate and jitter", () => {
  it("reports 60 Hz and the interval SD (sample SD, n − 1) of jittered time stamps", () => {
    const times = Array.from({ length: 601 }, (_, k) => k * (1000 / 60) + (k % 2 === 0 ? 0.5 : -0.5));
    const r = sampleRateReport(times);
    expect(r.meanRateHz).toBeCloseTo(60, 1);
    const intervals = times.slice(1).map((t, i) => t - times[i]!);
    expect(r.jitterSdMs).toBeCloseTo(sampleStandardDeviation(intervals), 12);
    expect(r.gaps).toBe(0);
  });
  it("counts gaps longer than 3 median intervals", () => {
    expect(sampleRateReport([0, 10, 20, 30, 100, 110]).gaps).toBe(1);
    expect(() => sampleRateReport([0, 1])).toThrow("sampleRateReport requires at least 3 time stamps");
  });
});

describe("gyroscope unit check (W3C DeviceMotion deg/s vs W3C Gyroscope rad/s)", () => {
  // three.js drives a device tilting back and forth while turning
  const tilting = virtualDeviceSamples((t) => aboutVertical(20 * Math.sin(t / 400)).multiply(upright()).multiply(aboutDevice([1, 0, 0], 35 * Math.sin(t / 250))), 3000, 60);
  it("accepts a stream in deg/s", () => {
    const r = checkGyroUnits(tilting);
    expect(r.verdict).toBe("deg/s");
    expect(r.ratio).toBeGreaterThan(0.8);
    expect(r.ratio).toBeLessThan(1.25);
  });
  it("catches a stream in rad/s (ratio ≈ π/180)", () => {
    const rad = tilting.map((s) => ({ ...s, gyroX: (s.gyroX * Math.PI) / 180, gyroY: (s.gyroY * Math.PI) / 180, gyroZ: (s.gyroZ * Math.PI) / 180 }));
    const r = checkGyroUnits(rad);
    expect(r.verdict).toBe("rad/s");
    expect(r.ratio).toBeCloseTo(Math.PI / 180, 2);
  });
  it("says unknown without accelerometer data or without tilt", () => {
    expect(checkGyroUnits(tilting.map(({ tMs, gyroX, gyroY, gyroZ }) => ({ tMs, gyroX, gyroY, gyroZ }))).verdict).toBe("unknown");
    expect(checkGyroUnits(still(2000, [0, 0, 0], 0.1)).verdict).toBe("unknown");
  });
});
