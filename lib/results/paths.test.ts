import { describe, expect, test } from "vitest";
import { pathAccuracy } from "../analysis/pathAccuracy";
import { parseTransferConfig } from "../motion/config";
import { formatSampleCsv } from "../motion/csv";
import { simulateSequence } from "../motion/simulate";
import { sequenceLayout } from "../runner/geometry";
import type { ReplayedPositions } from "./replayPositions";
import { sequencePathMeasures, type RecordedMovement } from "./sequencePathMeasures";
import { streamPaths } from "./streamPaths";

/** A hand-made replay: the aim at each sample time. */
const replay = (points: [number, number, number][]): ReplayedPositions => ({
  t: Float64Array.from(points.map((p) => p[0])),
  x: Float64Array.from(points.map((p) => p[1])),
  y: Float64Array.from(points.map((p) => p[2])),
  dropped: 0,
  maxGapMs: 10,
});

describe("path measures from a replayed stream", () => {
  // Targets at x = 0 and 100 (W = 10). The aim rests at 0 until the first selection at t = 30 ms,
  // reaches 100 at t = 90 with a bump of +4 across, selected then (movement 1, 60 ms), then back to
  // 0 at t = 150, selected then (movement 2, 60 ms). No other start time fits every selection.
  const aim = replay([
    [0, 0, 0], [10, 0, 0], [20, 0, 0], [30, 0, 0], [40, 25, 2], [50, 50, 4], [60, 75, 2], [70, 98, 0], [80, 99, 0], [90, 100, 0],
    [100, 75, -1], [110, 50, -3], [120, 25, -1], [130, 2, 0], [140, 1, 0], [150, 0, 0], [160, 0, 0],
  ]);
  const m = (trial: number, fromX: number, toX: number, endX: number): RecordedMovement => ({
    trial, from: { x: fromX, y: 0 }, to: { x: toX, y: 0 }, start: { x: fromX, y: 0 }, end: { x: endX, y: 0 }, timeMs: 60, width: 10,
  });
  test("finds the first selection's stream time from the durations alone, and measures each movement on its own stretch", () => {
    const r = sequencePathMeasures(aim, [m(1, 0, 100, 100), m(2, 100, 0, 0)], { geometry: "plane", task: "ring", hysteresis: 1 });
    if (!r.ok) throw new Error(r.reason);
    expect(r.firstSelectionMs).toBe(30);
    expect(r.residual).toBe(0);
    // Movement 1 is the aim from t = 30 to t = 90; its measures are pathAccuracy's on that stretch.
    const first = [[0, 0], [25, 2], [50, 4], [75, 2], [98, 0], [99, 0], [100, 0]].map(([x, y]) => ({ x: x!, y: y! }));
    expect(r.measures.get(1)).toEqual(pathAccuracy(first, { x: 0, y: 0 }, { x: 100, y: 0 }, 10, { hysteresis: 1 }));
    expect(r.measures.get(1)!.mo).toBeCloseTo(8 / 7, 12);
    // Movement 2 runs from 100 back to 0: the task axis points the other way, so "across" flips sign.
    expect(r.measures.get(2)!.mo).toBeGreaterThan(0);
  });
  test("a stream that does not reproduce the recorded selections gives no measures, and says why", () => {
    const r = sequencePathMeasures(aim, [m(1, 0, 100, 100), { ...m(2, 100, 0, 0), end: { x: 60, y: 0 } }], { geometry: "plane", task: "ring" });
    expect(r.ok).toBe(false);
    expect(!r.ok && r.reason).toMatch(/misses the recorded selection points by up to/);
  });
  test("the simulated participant's own stream replays onto its selections (pipeline consistency, not an outside reference)", () => {
    const layout = sequenceLayout("ring", 9, 300, 30);
    const config = { displayMode: "cursor" as const, gain: 3, pixelsPerDegree: 10 };
    const sim = simulateSequence({ targets: layout.order, amplitude: 300, width: 30 }, config, { seed: 5 });
    const movements = sim.trials.map((t) => ({ trial: t.trial, from: { x: t.from_x, y: t.from_y }, to: { x: t.to_x, y: t.to_y }, start: { x: t.start_x, y: t.start_y }, end: { x: t.end_x, y: t.end_y }, timeMs: t.time_ms, width: 30 }));
    const r = streamPaths(formatSampleCsv(sim.samples), parseTransferConfig(config), { displayMode: "cursor", pixelsPerUnit: 1 }, movements, { geometry: "plane", task: "ring" });
    if (!r.ok) throw new Error(r.reason);
    expect(r.residual).toBeLessThan(1e-6 * 300);
    expect(r.measures.size).toBe(9);
  });
});
