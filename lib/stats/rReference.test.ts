// Checks lib/stats against values R computed once (tests/fixtures/stats/reference.R, its printed
// output reference.json): R 4.2.2 with afex 1.2.1 (car 3.1.1), Debian 12's r-base-core and
// r-cran-afex. The ANOVA references are afex::aov_ez(type = 3) with car's univariate tests
// (summary(fit$Anova, multivariate = FALSE)) and afex's pes/ges; paired and Welch t from t.test,
// Holm from p.adjust, the line from lm. Every value is compared within 1e-6 (relative for the
// larger ones).
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { holm, jStat, leastSquaresLine, mixedAnova, pairedT, welchT, type AnovaEffect } from "./index";

const DIR = "tests/fixtures/stats/";
interface RefEffect {
  effect: string;
  ss: number;
  ssError: number;
  df1: number;
  df2: number;
  F: number;
  p: number;
  epsilonGG: number | null;
  pGG: number | null;
  epsilonHF: number | null;
  pHF: number | null;
  mauchlyW: number | null;
  mauchlyP: number | null;
  partialEta2: number;
  generalizedEta2: number;
}
interface RefDesign {
  name: string;
  between: string | string[] | null;
  within: string | string[];
  singular: boolean;
  effects: RefEffect[];
}
const ref = JSON.parse(readFileSync(DIR + "reference.json", "utf8")) as {
  software: { R: string; afex: string; car: string };
  anova: RefDesign[];
  pairedT: { a: number[]; b: number[]; t: number; df: number; p: number; meanDiff: number; dz: number };
  welchT: { a: number[]; b: number[]; t: number; df: number; p: number };
  holm: { p: (number | null)[]; adjusted: (number | null)[]; adjustedDroppingMissing: (number | null)[] };
  regression: { x: number[]; y: number[]; intercept: number; slope: number; r2: number };
};
const list = (v: string | string[] | null): string[] => (v === null ? [] : Array.isArray(v) ? v : [v]);

/** |actual − expected| ≤ 1e-6 · max(1, |expected|). */
function near(actual: number | null | undefined, expected: number, what: string): void {
  expect(actual, what).not.toBeNull();
  expect(Math.abs(actual! - expected), `${what}: ${actual} vs R ${expected}`).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(expected)));
}

/** Reads a design's long table (id, between…, within…, y) into the input of mixedAnova. */
function loadDesign(d: RefDesign) {
  const between = list(d.between);
  const within = list(d.within);
  const lines = readFileSync(`${DIR}design-${d.name}.csv`, "utf8").trim().split("\n");
  const header = lines[0]!.split(",");
  const rows = lines.slice(1).map((l) => Object.fromEntries(l.split(",").map((v, i) => [header[i]!, v])) as Record<string, string>);
  const levels = (f: string) => [...new Set(rows.map((r) => r[f]!))];
  const wLevels = within.map(levels);
  const bLevels = between.map(levels);
  const ids = [...new Set(rows.map((r) => r.id!))];
  const cellOf = (r: Record<string, string>) => within.reduce((c, f, i) => c * wLevels[i]!.length + wLevels[i]!.indexOf(r[f]!), 0);
  const groupOf = (r: Record<string, string>) => between.reduce((c, f, i) => c * bLevels[i]!.length + bLevels[i]!.indexOf(r[f]!), 0);
  const cells = wLevels.reduce((c, l) => c * l.length, 1);
  const values = ids.map(() => new Array<number>(cells).fill(Number.NaN));
  const groups = ids.map(() => 0);
  for (const r of rows) {
    const s = ids.indexOf(r.id!);
    values[s]![cellOf(r)] = Number(r.y);
    groups[s] = groupOf(r);
  }
  return {
    values,
    groups,
    within: within.map((name, i) => ({ name, levels: wLevels[i]!.length })),
    between: between.map((name, i) => ({ name, levels: bLevels[i]!.length })),
  };
}

/** Effects are matched by their set of factors (R lists between factors first; we list them in column order). */
const key = (effect: string) => effect.split(":").sort().join(":");

describe(`mixed ANOVA against ${ref.software.R}, afex ${ref.software.afex} (car ${ref.software.car})`, () => {
  test.each(ref.anova.map((d) => [d.name, d] as const))("%s", (_name, design) => {
    const out = mixedAnova(loadDesign(design));
    const byKey = new Map<string, AnovaEffect>(out.map((e) => [key(e.effect), e]));
    expect(out).toHaveLength(design.effects.length);
    for (const r of design.effects) {
      const e = byKey.get(key(r.effect));
      expect(e, r.effect).toBeDefined();
      const at = `${design.name} ${r.effect}`;
      expect(e!.df1, `${at} df1`).toBe(r.df1);
      expect(e!.df2, `${at} df2`).toBe(r.df2);
      near(e!.ssEffect, r.ss, `${at} SS`);
      near(e!.ssError, r.ssError, `${at} SS error`);
      near(e!.F, r.F, `${at} F`);
      near(e!.p, r.p, `${at} p`);
      near(e!.partialEta2, r.partialEta2, `${at} partial η²`);
      near(e!.generalizedEta2, r.generalizedEta2, `${at} generalised η²`);
      if (r.epsilonGG !== null) {
        near(e!.epsilonGG, r.epsilonGG, `${at} GG ε`);
        near(e!.pGG, r.pGG!, `${at} p GG`);
        near(e!.epsilonHF, r.epsilonHF!, `${at} HF ε`);
        near(e!.pHF, r.pHF!, `${at} p HF`);
        near(e!.mauchly?.W, r.mauchlyW!, `${at} Mauchly W`);
        near(e!.mauchly?.p, r.mauchlyP!, `${at} Mauchly p`);
      } else if (design.singular && e!.kind !== "between") {
        // R: "error SSP matrix singular: non-sphericity tests and corrections not available".
        expect(e!.epsilonGG, `${at} GG ε not computable`).toBeNull();
        expect(e!.epsilonHF).toBeNull();
        expect(e!.pGG).toBeNull();
        expect(e!.mauchly).toBeNull();
        expect(e!.note).toMatch(/singular/);
      } else if (e!.kind === "between") {
        expect(e!.epsilonGG, `${at}: no ε for a between effect`).toBeNull();
      } else {
        // One df: R prints no ε or Mauchly; sphericity holds trivially (ε = 1, science.md §4).
        expect(e!.epsilonGG).toBe(1);
        expect(e!.pGG).toBe(e!.p);
        expect(e!.mauchly).toBeNull();
      }
    }
  });
  test("the n < k designs report the singular covariance, with the lower-bound p", () => {
    for (const name of ["small3x4", "mixedsmall"]) {
      const design = ref.anova.find((d) => d.name === name)!;
      const within = mixedAnova(loadDesign(design)).filter((e) => e.kind !== "between");
      for (const e of within) {
        expect(e.note).toMatch(/error degrees? of freedom \(needs ≥ 3\)/);
        // Lower bound (Greenhouse & Geisser 1959): ε = 1/(k − 1) turns F(3q, 3ν) into F(q, ν); the
        // tail from jstat's F cdf (an outside implementation; ours reads the incomplete beta).
        near(e.pLowerBound, 1 - jStat.centralF.cdf(e.F!, e.df1 / 3, e.df2 / 3), `${name} ${e.effect} lower-bound p`);
      }
    }
  });
});

describe(`t tests, Holm and the least-squares line against ${ref.software.R}`, () => {
  test("paired t and d_z (t.test(paired = TRUE); d_z = mean/sd of the differences)", () => {
    const r = pairedT(ref.pairedT.a, ref.pairedT.b);
    near(r.t, ref.pairedT.t, "t");
    near(r.p, ref.pairedT.p, "p");
    near(r.meanDiff, ref.pairedT.meanDiff, "mean difference");
    near(r.dz, ref.pairedT.dz, "d_z");
    expect(r.df).toBe(ref.pairedT.df);
  });
  test("Welch t (t.test(var.equal = FALSE))", () => {
    const r = welchT(ref.welchT.a, ref.welchT.b);
    near(r.t, ref.welchT.t, "t");
    near(r.df, ref.welchT.df, "df");
    near(r.p, ref.welchT.p, "p");
  });
  test("Holm counts a comparison that could not be computed (R: p.adjust(p[!is.na(p)], 'holm', n = length(p)))", () => {
    const r = holm(ref.holm.p);
    ref.holm.adjusted.forEach((v, i) => (v === null ? expect(r[i]).toBeNull() : near(r[i], v, `Holm ${i}`)));
    // R's default drops the missing one from m: smaller (less conservative) values, which we do not give.
    ref.holm.adjustedDroppingMissing.forEach((v, i) => v !== null && v < ref.holm.adjusted[i]! && expect(r[i]!).toBeGreaterThan(v));
  });
  test("least-squares line (lm)", () => {
    const r = leastSquaresLine(ref.regression.x, ref.regression.y);
    near(r.intercept, ref.regression.intercept, "intercept");
    near(r.slope, ref.regression.slope, "slope");
    near(r.r2, ref.regression.r2, "r²");
  });
});
