import { describe, expect, test } from "vitest";
import { isInsideTarget, sequenceLayout } from "./geometry";
import { createSequenceRecorder } from "./sequenceRecorder";

// Spherical law of cosines (any spherical trigonometry text), independent of the code's
// atan2(|u × v|, u·v): cos c = sin φ1 sin φ2 + cos φ1 cos φ2 cos Δλ, φ pitch, λ yaw.
const R = Math.PI / 180;
const greatCircle = (a: { x: number; y: number }, b: { x: number; y: number }) =>
  Math.acos(Math.min(1, Math.sin(a.y * R) * Math.sin(b.y * R) + Math.cos(a.y * R) * Math.cos(b.y * R) * Math.cos((b.x - a.x) * R))) / R;

describe("view-mode layout on the sphere (science.md §1 'View mode')", () => {
  test.each([[13, 40], [9, 70], [25, 15]])("ring of %i targets, A = %i°: every hop spans A on a great circle; every target lies ρ from straight ahead", (n, amplitude) => {
    const l = sequenceLayout("ring", n, amplitude, 4, "sphere");
    expect(l.surface).toBe("sphere");
    for (let i = 1; i < l.order.length; i++) expect(greatCircle(l.order[i - 1]!, l.order[i]!)).toBeCloseTo(amplitude, 9);
    const rho = l.all.map((t) => greatCircle({ x: 0, y: 0 }, t));
    for (const r of rho) expect(r).toBeCloseTo(rho[0]!, 9);
    // Yaw and pitch read as Cartesian would put the hops elsewhere: the plane layout's hops differ on the sphere.
    const flat = sequenceLayout("ring", n, amplitude, 4);
    expect(Math.abs(greatCircle(flat.order[0]!, flat.order[1]!) - amplitude)).toBeGreaterThan(1e-5);
  });
  test("strips: centres on the horizon A apart", () => {
    const l = sequenceLayout("strip", 5, 30, 4, "sphere");
    expect(greatCircle(l.order[0]!, l.order[1]!)).toBeCloseTo(30, 12);
  });
  test("a hit is within W/2 on a great circle: at 60° pitch, 3.5° of yaw is 1.75° away, inside W = 4°", () => {
    const target = { x: 10, y: 60 };
    const p = { x: 13.5, y: 60 };
    expect(greatCircle(target, p)).toBeCloseTo(1.7497, 3);
    expect(isInsideTarget("ring", target, { x: 1, y: 0 }, p, 4, "sphere")).toBe(true);
    expect(isInsideTarget("ring", target, { x: 1, y: 0 }, p, 4, "plane")).toBe(false);
    expect(isInsideTarget("ring", target, { x: 1, y: 0 }, { x: 10, y: 62.1 }, 4, "sphere")).toBe(false);
  });
  test("the recorder decides hits on the layout's surface", () => {
    const l = sequenceLayout("ring", 5, 40, 4, "sphere");
    const r = createSequenceRecorder(l, 10_000);
    r.select(0, l.order[0]!);
    const t = l.order[1]!;
    // 1.9° of pitch off the target: inside W/2 = 2° on the sphere.
    expect(r.select(800, { x: t.x, y: t.y + 1.9 })!.hit).toBe(1);
    const u = l.order[2]!;
    expect(r.select(1600, { x: u.x, y: u.y + 2.1 })!.hit).toBe(0);
  });
});
