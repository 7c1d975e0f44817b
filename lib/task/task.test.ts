import { describe, expect, test } from "vitest";
import { nominalIndexOfDifficulty, ringAmplitude, ringTargets, ringVisitingOrder, stripTargets } from "./index";

const EPS = 1e-9;

describe("ring visiting order", () => {
  // Common practice for the multi-directional task (from memory, not re-read in ISO 9241-411):
  // the order k·(n+1)/2 mod n, which for n = 13 starts 0, 7, 1, 8, 2, ... The sequence below is
  // written out by hand from that rule; the property that matters is checked on its own next.
  test("n = 13: 0, 7, 1, 8, 2, … (the rule k·(n+1)/2 mod n, written out by hand)", () => {
    expect(ringVisitingOrder(13)).toEqual([0, 7, 1, 8, 2, 9, 3, 10, 4, 11, 5, 12, 6, 0]);
  });
  test("every hop goes (n ± 1)/2 places round the ring: across the circle, never to a neighbour", () => {
    for (const n of [5, 9, 13, 25]) {
      const order = ringVisitingOrder(n);
      for (let i = 1; i < order.length; i++) {
        const step = (order[i]! - order[i - 1]! + n) % n;
        expect([(n - 1) / 2, (n + 1) / 2]).toContain(step);
      }
    }
  });
  test("every target is visited once before returning", () => {
    for (const n of [3, 5, 9, 13, 25]) {
      const order = ringVisitingOrder(n);
      expect(order).toHaveLength(n + 1);
      expect(new Set(order.slice(0, n)).size).toBe(n);
      expect(order[n]).toBe(0);
    }
  });
  test("rejects even n", () => {
    expect(() => ringVisitingOrder(12)).toThrow(/odd number/);
  });
});

describe("ring amplitude (chord)", () => {
  // Common practice (ISO 9241-411): A = D·cos(π/(2n)); checked against the geometric chord between
  // consecutive visited targets of the layout, computed independently.
  test("equals the distance between consecutive visited targets", () => {
    for (const n of [5, 9, 13, 25]) {
      const d = 400;
      const targets = ringTargets(n, d, { x: 10, y: -3 });
      const order = ringVisitingOrder(n);
      for (let k = 0; k < n; k++) {
        const p = targets[order[k]!]!;
        const q = targets[order[k + 1]!]!;
        expect(Math.hypot(q.x - p.x, q.y - p.y)).toBeCloseTo(ringAmplitude(n, d), 9);
      }
    }
  });
  test("n = 13, D = 512: worked by hand with the cosine series, 512·(1 − x²/2 + x⁴/24), x = π/26, = 508.267", () => {
    expect(ringAmplitude(13, 512)).toBeCloseTo(508.267, 3);
  });
});

describe("ring targets", () => {
  test("lie on the circle and target 0 is at the top", () => {
    const t = ringTargets(9, 300, { x: 50, y: 60 });
    for (const p of t) expect(Math.hypot(p.x - 50, p.y - 60)).toBeCloseTo(150, 9);
    expect(t[0]!.x).toBeCloseTo(50, 9);
    expect(t[0]!.y).toBeCloseTo(-90, 9);
  });
});

describe("strip targets", () => {
  test("centres are amplitude apart along the axis", () => {
    const [a, b] = stripTargets(200, 20, { x: 5, y: 5 }, Math.PI / 6);
    expect(Math.hypot(b.centre.x - a.centre.x, b.centre.y - a.centre.y)).toBeCloseTo(200, 9);
    expect(a.axis.x).toBeCloseTo(Math.cos(Math.PI / 6), 12);
    expect(() => stripTargets(10, 20)).toThrow(/width < amplitude/);
  });
});

describe("nominal ID", () => {
  // Shannon form log2(A/W + 1) (MacKenzie 1992): A = 7W gives exactly 3 bits.
  test("A/W = 7 gives 3 bits", () => {
    expect(Math.abs(nominalIndexOfDifficulty(224, 32) - 3)).toBeLessThan(EPS);
    expect(() => nominalIndexOfDifficulty(10, 0)).toThrow(/positive width/);
  });
});
