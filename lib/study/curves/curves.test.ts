import { describe, expect, it } from "vitest";
import { parseTransferConfig } from "@/lib/motion/config";
import { gainCurvePoints, stickResponsePoints, tiltResponsePoints, turnDisplacement } from ".";

describe("the pictures of a setting", () => {
  it("constant gain 6: a 30°/s device speed gives 180°/s (common practice: gain 6 turns 30° into 180°)", () => {
    const c = gainCurvePoints(parseTransferConfig({ gain: 6 }), 60, 2);
    expect(c.points).toEqual([{ device: 0, output: 0 }, { device: 30, output: 180 }, { device: 60, output: 360 }]);
    expect(c.smoothingBelow).toBeNull();
  });
  it("a two-level curve halves slow speeds and keeps fast ones; a dead band shifts both marks", () => {
    const c = gainCurvePoints(parseTransferConfig({ gain: 4, gainCurve: "two-level", curveSlowSpeedDegPerS: 5, curveFastSpeedDegPerS: 30, curveSlowGainFactor: 0.5, deadBandDegPerS: 1, smoothingTimeMs: 40, smoothingSpeedDegPerS: 8 }), 100, 100);
    // speed 4 °/s: 3 °/s after the 1 °/s band, slow factor 0.5 → 4 × 0.5 × 3 = 6 (Casiez & Roussel 2011: slow input, lower gain)
    expect(c.points[4]!.output).toBeCloseTo(6, 12);
    // speed 61 °/s: 60 after the band, above the fast speed → 4 × 60
    expect(c.points[61]!.output).toBeCloseTo(240, 12);
    expect(c.points[1]!.output).toBe(0); // inside the dead band
    expect([c.deadBand, c.slowSpeed, c.fastSpeed, c.smoothingBelow]).toEqual([1, 6, 31, 9]);
  });
  it("cursor mode multiplies by pixels per degree", () => {
    const c = gainCurvePoints(parseTransferConfig({ gain: 2, displayMode: "cursor", pixelsPerDegree: 15 }), 10, 1);
    expect(c.points[1]).toEqual({ device: 10, output: 300 });
    expect(c.unit).toBe("px/s");
  });
  it("stick: no rate inside the dead zone, the top rate from the outer edge (science.md §8)", () => {
    const r = stickResponsePoints(parseTransferConfig({ stickDeadZone: 0.2, stickOuterEdge: 0.9, stickExponent: 1, stickMaxRateDegPerS: 140 }), 20);
    expect(r.points[4]!.rate).toBe(0); // 0.2
    expect(r.points[11]!.rate).toBeCloseTo(70, 9); // 0.55: half-way between 0.2 and 0.9, linear
    expect(r.points[18]!.rate).toBe(140); // 0.9
  });
  it("tilt: the same stage over tilt angles", () => {
    const r = tiltResponsePoints(parseTransferConfig({ technique: "tilt-rate", tiltDeadZoneDeg: 5, tiltMaxDeg: 30, tiltExponent: 1, tiltMaxRateDegPerS: 120 }), 6);
    expect(r.points[3]).toEqual({ x: 22.5, rate: expect.closeTo(84, 9) as number });
  });
  it("a 30° turn at gain 2 moves the view 60°, at gain 6 180° (common practice), through the real engine", () => {
    expect(turnDisplacement(parseTransferConfig({ gain: 2 }), 30, 250)!.displacement).toBeCloseTo(60, 6);
    expect(turnDisplacement(parseTransferConfig({ gain: 6 }), 30, 250)!.displacement).toBeCloseTo(180, 6);
    expect(turnDisplacement(parseTransferConfig({ gain: 6, frame: "device", deviceHorizontalAxis: "screen-normal" }), 30, 250)!.hold).toBe("flat");
  });
  it("a slow turn at a two-level curve moves less than a quick one; a stick or mouse level has no motion", () => {
    const cfg = parseTransferConfig({ gain: 6, gainCurve: "two-level", curveSlowSpeedDegPerS: 20, curveFastSpeedDegPerS: 60, curveSlowGainFactor: 0.4 });
    expect(turnDisplacement(cfg, 30, 3000)!.displacement).toBeLessThan(turnDisplacement(cfg, 30, 200)!.displacement - 20);
    expect(turnDisplacement(parseTransferConfig({ technique: "stick" }), 30, 250)).toBeNull();
  });
});
