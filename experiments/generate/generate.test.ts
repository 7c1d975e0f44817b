import { describe, expect, test } from "vitest";
import { ringAmplitude } from "../../lib/task";
import { generateTrialRows } from "./index";

describe("simulated trial table", () => {
  test("is reproducible from its seed and truncates to whole sequences", () => {
    const a = [...generateTrialRows({ maxMovements: 100, seed: 5 })];
    const b = [...generateTrialRows({ maxMovements: 100, seed: 5 })];
    expect(a).toEqual(b);
    expect(a.length % 13).toBe(0);
    expect(a.length).toBeGreaterThanOrEqual(100);
  });
  test("target centres hop by the chord A = D·cos(π/(2n)) (common practice, ISO 9241-411)", () => {
    const rows = [...generateTrialRows({ maxMovements: 13 })];
    const d = 128 / Math.cos(Math.PI / 26);
    for (const r of rows) expect(Math.hypot(r.toX - r.fromX, r.toY - r.fromY)).toBeCloseTo(ringAmplitude(13, d), 1);
  });
});
