import { describe, expect, it } from "vitest";
import { analyzeTrials } from "../../analysis";
import { ringTargets, ringVisitingOrder, ringAmplitude } from "../../task";
import { estimateBiasAtRest } from "../calibration/biasAtRest";
import { parseSampleCsv, formatSampleCsv, sampleFromTable } from "../csv";
import { createMotionEngine } from "../engine";
import { fittsMovementTimeMs, minimumJerkFraction } from "./minimumJerk";
import { simulateSequence } from "./participant";
import { createSeededRandom } from "./prng";
import { deviceSpeedForOutputSpeed } from "./inverseTransfer";
import { defaultTransferConfig } from "../config";
import type { TrialRow } from "./trialRow";

const n = 13, D = 480, W = 48;
const ring = ringTargets(n, D, { x: 640, y: 400 });
const targets = ringVisitingOrder(n).map((i) => ring[i]!);
// ringVisitingOrder gives n + 1 selections (back to the start): n movements
const A = ringAmplitude(n, D);
const cursorConfig = { displayMode: "cursor" as const, gain: 3, pixelsPerDegree: 12, frame: "adaptive" as const };

describe("building blocks", () => {
  it("minimum-jerk profile (Flash & Hogan 1985): 0, ½, 1 at τ = 0, ½, 1, zero velocity at the ends", () => {
    expect(minimumJerkFraction(0)).toBe(0);
    expect(minimumJerkFraction(0.5)).toBeCloseTo(0.5, 12);
    expect(minimumJerkFraction(1)).toBe(1);
    expect(minimumJerkFraction(1e-4) / 1e-4).toBeLessThan(1e-6);
  });
  it("Fitts MT with the Shannon ID (MacKenzie 1992): 300 + 150·log2(448/64 + 1) = 750 ms", () => {
    expect(fittsMovementTimeMs(300, 150, 448, 64)).toBeCloseTo(750, 9);
  });
  it("mulberry32 is reproducible and roughly uniform; normals have mean 0, SD 1", () => {
    const a = createSeededRandom(9), b = createSeededRandom(9);
    const xs = Array.from({ length: 20000 }, () => a.normal());
    expect(b.normal()).toBe(xs[0]);
    const m = xs.reduce((s, x) => s + x, 0) / xs.length;
    const sd = Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1));
    expect(Math.abs(m)).toBeLessThan(0.03);
    expect(Math.abs(sd - 1)).toBeLessThan(0.03);
  });
  it("the inverse speed map undoes the gain curve and dead band", () => {
    for (const gainCurve of ["constant", "two-level", "power"] as const) {
      const c = { ...defaultTransferConfig, gainCurve, gain: 4, deadBandDegPerS: 1.5 };
      const s = deviceSpeedForOutputSpeed(c, 90);
      const createdOut = createMotionEngine(c);
      createdOut.push({ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 });
      expect(-createdOut.push({ tMs: 100, gyroX: 0, gyroY: s, gyroZ: 0 })!.dx / 0.1).toBeCloseTo(90, 6);
    }
  });
});

describe("simulated participant", () => {
  it("its sensor stream, replayed through the engine, puts the cursor where it logged the selections", () => {
    const sim = simulateSequence({ targets, amplitude: A, width: W }, cursorConfig, { seed: 3, sensor: "phone", hold: "upright" });
    const table = parseSampleCsv(formatSampleCsv(sim.samples), "sim.csv");
    const e = createMotionEngine(cursorConfig);
    let x = targets[0]!.x, y = targets[0]!.y, s = 1;
    const sample = { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 };
    for (let i = 0; i < table.length; i++) {
      const o = e.push(sampleFromTable(table, i, sample))!;
      x += o.dx;
      y += o.dy;
      const sel = sim.selections[s];
      if (sel && sample.tMs === sel.tMs) {
        expect(x).toBeCloseTo(sel.x, 6);
        expect(y).toBeCloseTo(sel.y, 6);
        s++;
      }
    }
    expect(s).toBe(sim.selections.length);
  });

  it("reaches its intended endpoints through the engine despite noise, bias and a curved gain (within 3 px)", () => {
    // (fine-aim smoothing is left out: it reshapes slow movement on purpose, so endpoints move)
    const cfg = { ...cursorConfig, gainCurve: "two-level" as const, frame: "gravity" as const, addedLatencyMs: 50 };
    const rest = simulateSequence({ targets, amplitude: A, width: W }, cfg, { seed: 5, sensor: "controller", hold: "flat" });
    const b = estimateBiasAtRest(rest.samples);
    const sim = simulateSequence({ targets, amplitude: A, width: W }, { ...cfg, biasXDegPerS: b.biasXDegPerS, biasYDegPerS: b.biasYDegPerS, biasZDegPerS: b.biasZDegPerS }, { seed: 5, sensor: "controller", hold: "flat" });
    sim.trials.forEach((t, i) => {
      const want = sim.intendedEndpoints[i]!;
      expect(Math.hypot(t.end_x - want.x, t.end_y - want.y)).toBeLessThan(3);
    });
  });

  it("is reproducible from its seed and supports the mouse baseline", () => {
    const a = simulateSequence({ targets, amplitude: A, width: W }, { technique: "mouse", displayMode: "cursor" }, { seed: 11 });
    const b = simulateSequence({ targets, amplitude: A, width: W }, { technique: "mouse", displayMode: "cursor" }, { seed: 11 });
    expect(a.trials).toEqual(b.trials);
    expect(a.samples.some((s) => (s.pointerDx ?? 0) !== 0)).toBe(true);
    expect(() => simulateSequence({ targets, amplitude: A, width: W }, { technique: "stick" }, { seed: 1 })).toThrow("simulateSequence supports");
  });

  // Consistency check, not an outside reference: the analysis of the simulated logs (lib/analysis,
  // ISO 9241-411 effective measures) must recover the index of difficulty the participant was built
  // with, since its endpoint SD is W/4.133 (so We ≈ W, science.md §9).
  it("its logs, analysed, recover the index of difficulty it was built with", () => {
    const widths = [32, 64];
    // calibrate once from the participant's rest period, as the session runner does
    const rest = simulateSequence({ targets, amplitude: A, width: 32 }, cursorConfig, { seed: 999, sensor: "controller", hold: "upright" });
    const b = estimateBiasAtRest(rest.samples);
    const calibrated = { ...cursorConfig, biasXDegPerS: b.biasXDegPerS, biasYDegPerS: b.biasYDegPerS, biasZDegPerS: b.biasZDegPerS };
    const rows: (TrialRow & { seed: number })[] = [];
    let seq = 0;
    for (const w of widths) {
      for (let rep = 0; rep < 12; rep++) {
        seq++;
        const sim = simulateSequence({ targets, amplitude: A, width: w, sequence: seq, participant: "p1", condition: "motion" }, calibrated, {
          seed: 1000 + seq, sensor: "controller", hold: "upright", interceptMs: 300, slopeMsPerBit: 150, restMs: 200,
        });
        rows.push(...sim.trials.map((t) => ({ ...t, seed: seq })));
      }
    }
    const result = analyzeTrials(
      rows.map((r) => ({
        participant: r.participant, condition: r.condition, block: r.block, sequence: r.sequence, trial: r.trial,
        amplitude: r.amplitude, width: r.width, fromX: r.from_x, fromY: r.from_y, toX: r.to_x, toY: r.to_y,
        startX: r.start_x, startY: r.start_y, endX: r.end_x, endY: r.end_y, timeMs: r.time_ms, hit: r.hit === 1, factors: {},
      })),
      { start: "actual", exclude: "none", unit: "px" },
    );
    for (const w of widths) {
      const built = Math.log2(A / w + 1);
      const seqs = result.sequences.filter((s) => s.width === w);
      expect(seqs).toHaveLength(12);
      expect(seqs.every((q) => q.n === n)).toBe(true);
      const meanIde = seqs.reduce((s, q) => s + q.ide, 0) / seqs.length;
      // 12 sequences × 13 movements: the SD estimate is good to ≈ 6 %, i.e. ≈ 0.1 bit in IDe
      expect(Math.abs(meanIde - built)).toBeLessThan(0.2);
      const meanMt = seqs.reduce((s, q) => s + q.mt, 0) / seqs.length;
      expect(Math.abs(meanMt - fittsMovementTimeMs(300, 150, A, w)) / meanMt).toBeLessThan(0.05);
    }
  });
});
