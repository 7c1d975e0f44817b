import { describe, expect, it } from "vitest";
import { studyDesignSchema } from "@/lib/study/design";
import { clopperPearson, conditionNoise, pairedTPower, powerCurveNs, powerModelFor, simulatePower } from ".";

describe("analytic references", () => {
  it("paired t power from jstat's noncentral t: d_z = 0.5 needs n = 34 for 80 % (Cohen 1988, table 2.4.1 for one-sample / paired d; from memory: 0.80 at n ≈ 34)", () => {
    const p = pairedTPower(0.5, 1, 34);
    expect(p).toBeGreaterThan(0.79);
    expect(p).toBeLessThan(0.83);
    expect(pairedTPower(0.5, 1, 33)).toBeLessThan(p);
  });
  it("with no effect, power equals α (the test's own size)", () => {
    expect(pairedTPower(0, 1, 12)).toBeCloseTo(0.05, 7); // jstat inverts t to ~1e-9
  });
  it("Clopper–Pearson 95 % for 5 of 10: [0.1871, 0.8129] (Clopper & Pearson 1934; the interval tabled in most texts)", () => {
    const [lo, hi] = clopperPearson(5, 10);
    expect(lo).toBeCloseTo(0.1871, 4);
    expect(hi).toBeCloseTo(0.8129, 4);
    expect(clopperPearson(0, 20)[0]).toBe(0);
  });
});

describe("simulated power against the analytic answer", () => {
  it("two conditions: the simulated share of the paired test matches the noncentral-t power (Cohen 1988; jstat) within its 99 % Monte Carlo interval", () => {
    const model = { mainLevelOfCondition: [0, 1], levels: 2, cellSd: [0.2, 0.3], smallestDifference: 0.3, spreadBetweenPeople: 0.4, alpha: 0.05 };
    const sdDiff = Math.sqrt(0.4 ** 2 + 0.2 ** 2 + 0.3 ** 2);
    const points = simulatePower(model, [4, 10, 20], 3000, 20261203);
    for (const pt of points) {
      const analytic = pairedTPower(0.3, sdDiff, pt.n);
      const [lo, hi] = clopperPearson(pt.detected, pt.studies, 0.99);
      expect(analytic, `N = ${pt.n}: simulated ${pt.share}`).toBeGreaterThanOrEqual(lo);
      expect(analytic).toBeLessThanOrEqual(hi);
    }
  }, 60_000); // 9,000 simulated studies: about 4 s alone, far longer while the whole suite runs on a shared machine
  it("is seeded: the same inputs give the same curve", () => {
    const model = { mainLevelOfCondition: [0, 1, 2, 0, 1, 2], levels: 3, cellSd: [0.2, 0.2, 0.2, 0.2, 0.2, 0.2], smallestDifference: 0.4, spreadBetweenPeople: 0.3, alpha: 0.05 };
    expect(simulatePower(model, [6, 12], 100, 5)).toEqual(simulatePower(model, [6, 12], 100, 5));
  });
  it("N values fill whole counterbalancing rows (science.md §5)", () => {
    expect(powerCurveNs(6)).toEqual([6, 12, 18, 24, 30, 36, 42, 48, 54, 60]);
    expect(powerCurveNs(4)[0]).toBe(4);
    expect(powerCurveNs(2).at(-1)).toBe(60);
    expect(powerCurveNs(3)[0]).toBe(6);
  });
});

describe("stage one: cell noise from the simulated participant", () => {
  it("gives each condition a mean near the simulated person's own throughput and a positive SD", () => {
    const design = studyDesignSchema.parse({
      factors: [{ name: "gain", levels: [{ label: "g2", config: { gain: 2 } }, { label: "g4", config: { gain: 4 } }] }],
      task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [300], widths: [40], targetsPerRing: 9 },
      counterbalancing: { method: "williams", seed: 1 },
    });
    const noise = conditionNoise(design, 4, 3);
    expect(noise.map((n) => n.method)).toEqual(["simulated", "simulated"]);
    // The simulated person moves with MT = 300 + 150·log2(A/W + 1) ms (science.md §9) and endpoints of SD W/4.133,
    // so IDe ≈ log2(300/40 + 1) = 3.09 bits and MT ≈ 763 ms: TP ≈ 4 bits/s, within sampling error of 8 movements.
    for (const n of noise) {
      expect(n.meanTp).toBeGreaterThan(3);
      expect(n.meanTp).toBeLessThan(5.5);
      expect(n.sdTp).toBeGreaterThan(0);
    }
    const model = powerModelFor(design, { factor: "gain", smallestDifference: 0.5, spreadBetweenPeople: 0.3, alpha: 0.05 }, noise);
    expect(model.mainLevelOfCondition).toEqual([0, 1]);
  });
});

describe("from a pilot", () => {
  it("difference and spread of people's own differences: diffs 0.5 and 1.0 give mean 0.75, SD 0.3536 (sample SD, n − 1)", async () => {
    const { pilotEstimates } = await import(".");
    const cells = [
      { participant: "a", condition: "x", tp: 3 }, { participant: "a", condition: "y", tp: 3.5 },
      { participant: "b", condition: "x", tp: 2 }, { participant: "b", condition: "y", tp: 3 },
      { participant: "c", condition: "x", tp: 2 },
    ];
    const e = pilotEstimates(cells, { x: "lo", y: "hi" }, "lo", "hi");
    expect(e.difference).toBeCloseTo(0.75, 12);
    expect(e.spread).toBeCloseTo(Math.SQRT1_2 / 2, 12); // √((0.25² + 0.25²)/1) = 0.35355
    expect(e.people).toBe(2);
  });
});
