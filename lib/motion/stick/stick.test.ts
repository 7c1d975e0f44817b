import { describe, expect, it } from "vitest";
import { createMotionEngine } from "../engine";
import { totalOutput } from "../testing/virtualDevice";
import { stickHeadingDeg, wrapAngleDeg } from "./stickHeading";
import { stickRateMagnitude } from "./stickRate";

// Reference: the radial dead-zone mapping of science.md §8, m' = clamp((|s| − r0)/(r1 − r0), 0, 1),
// rate = m'^p · max; W3C Gamepad standard mapping (y down positive).
describe("stick rate mapping", () => {
  const r0 = 0.15, r1 = 0.95, p = 2, max = 180;
  it("is zero inside the dead zone", () => {
    for (const r of [0, 0.05, 0.1, 0.15]) expect(stickRateMagnitude(r, r0, r1, p, max)).toBe(0);
  });
  it("gives the full rate at and beyond the outer edge", () => {
    expect(stickRateMagnitude(0.95, r0, r1, p, max)).toBe(180);
    expect(stickRateMagnitude(1, r0, r1, p, max)).toBe(180);
  });
  it("is continuous at both edges", () => {
    const eps = 1e-7;
    expect(stickRateMagnitude(r0 + eps, r0, r1, p, max)).toBeCloseTo(0, 6);
    expect(stickRateMagnitude(r1 - eps, r0, r1, p, max)).toBeCloseTo(180, 3);
    expect(stickRateMagnitude(r1 - eps, r0, r1, 1, max)).toBeCloseTo(180, 3);
  });
  it("follows the power curve between the edges", () => {
    expect(stickRateMagnitude(0.55, r0, r1, 2, 180)).toBeCloseTo(45, 9);
  });
  it("moves the view in the stick's direction; pushing up (negative y) looks up", () => {
    const s = [{ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0, stickX: 0, stickY: 0 }, { tMs: 100, gyroX: 0, gyroY: 0, gyroZ: 0, stickX: 0, stickY: -1 }];
    const out = totalOutput(createMotionEngine({ technique: "stick" }).push, s);
    expect(out.y).toBeCloseTo(18, 9);
    expect(out.x).toBeCloseTo(0, 12);
  });
  it("motion+stick sums the two channels", () => {
    const s = [{ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }, { tMs: 100, gyroX: 0, gyroY: -10, gyroZ: 0, stickX: 1, stickY: 0 }];
    const out = totalOutput(createMotionEngine({ technique: "motion+stick", gain: 2 }).push, s);
    expect(out.x).toBeCloseTo(2 + 18, 9);
  });
});

describe("heading stick", () => {
  it("heading atan2(x, −y): up 0, right 90, left −90, down 180", () => {
    expect(stickHeadingDeg(0, -1)).toBeCloseTo(0, 12);
    expect(stickHeadingDeg(1, 0)).toBeCloseTo(90, 12);
    expect(stickHeadingDeg(-1, 0)).toBeCloseTo(-90, 12);
    expect(Math.abs(stickHeadingDeg(0, 1))).toBeCloseTo(180, 12);
    expect(wrapAngleDeg(350)).toBe(-10);
    expect(wrapAngleDeg(-190)).toBe(170);
  });
  const cfg = { technique: "motion+stick" as const, stickMode: "heading" as const, headingTurnTimeMs: 100 };
  const at = (t: number, x: number, y: number) => ({ tMs: t, gyroX: 0, gyroY: 0, gyroZ: 0, stickX: x, stickY: y });
  it("turns the view to the stick's heading, spread over the set time", () => {
    const e = createMotionEngine(cfg);
    e.push(at(0, 0, 0));
    const first = e.push(at(10, 1, 0))!.dx;
    expect(first).toBeCloseTo(9, 9); // 10 of 100 ms
    let sum = first;
    for (let t = 20; t <= 200; t += 10) sum += e.push(at(t, 1, 0))!.dx;
    expect(sum).toBeCloseTo(90, 9);
  });
  it("turning the stick around the rim keeps turning the view by the same angle, across ±180", () => {
    const e = createMotionEngine({ ...cfg, headingTurnTimeMs: 0 });
    e.push(at(0, 0, 0));
    let sum = e.push(at(10, 0, -1))!.dx; // forward: no turn
    for (let k = 1; k <= 36; k++) {
      const a = (k * 10 * Math.PI) / 180; // a full circle clockwise
      sum += e.push(at(10 + k * 10, Math.sin(a), -Math.cos(a)))!.dx;
    }
    expect(sum).toBeCloseTo(360, 9);
  });
  it("does nothing below the threshold, and the vertical still comes from motion", () => {
    const e = createMotionEngine(cfg);
    e.push(at(0, 0, 0));
    const o = e.push({ ...at(100, 0.5, 0), gyroX: -10 })!; // top edge tilted away: up
    expect(o.dx).toBeCloseTo(0, 12);
    expect(o.dy).toBeCloseTo(1, 9);
  });
});
