import type { FriedmanResult, IntervalSummary, RmAnovaEffect } from "../stats";
import type { PathAccuracy } from "./pathAccuracy";

/**
 * The analysis result. The keys up to `posthoc` are the public JSON contract of `analyze --json`
 * (docs/analysis.md); the rest are additions. Undefined numbers are NaN and serialise as null.
 */
export interface SequenceSummary {
  participant: string;
  condition: string;
  block: number;
  sequence: number;
  amplitude: number;
  width: number;
  /** Movements kept. */
  n: number;
  /** Misses among the kept movements, as a fraction. */
  errorRate: number;
  ae: number;
  sdx: number;
  we: number;
  ide: number;
  /** Mean movement time, ms. */
  mt: number;
  /** bits/s. */
  tp: number;
  /** Nominal ID, log2(A/W + 1). */
  id: number;
  /** Movements removed by the exclusion rule. */
  excluded: number;
  /** Mean path accuracy over the kept movements that have a sampled path. */
  path?: PathAccuracy & { movements: number };
}

export interface CellSummary {
  participant: string;
  condition: string;
  tp: number;
  mt: number;
  errorRate: number;
  we: number;
  ide: number;
  sequences: number;
}

export interface ConditionSummary {
  condition: string;
  n: number;
  tp: IntervalSummary;
  mt: IntervalSummary;
  errorRate: IntervalSummary;
  /** Levels of the f_ factors for this condition. */
  factors: Record<string, string>;
}

export interface RegressionRow {
  condition: string;
  /** ms. */
  intercept: number;
  /** ms/bit. */
  slope: number;
  r2: number;
  /** A×W points in the fit. */
  points: number;
}

export type AnovaRow = Pick<RmAnovaEffect, "effect" | "df1" | "df2" | "F" | "p" | "epsilonGG" | "pGG" | "partialEta2"> &
  Omit<RmAnovaEffect, "effect" | "df1" | "df2" | "F" | "p" | "epsilonGG" | "pGG" | "partialEta2">;

export interface PosthocRow {
  a: string;
  b: string;
  meanDiff: number;
  t: number;
  df: number;
  p: number;
  pHolm: number;
  dz: number;
}

export interface MissingReport {
  /** Participants left out of the ANOVA, post hoc tests and Friedman test for lacking a condition. */
  participantsExcluded: number;
  participantsIncluded: number;
  cells: { participant: string; condition: string }[];
}

export interface AnalysisResult {
  unit: "px" | "mm" | "deg";
  start: "actual" | "nominal";
  exclude: "misfire" | "none";
  excluded: number;
  sequences: SequenceSummary[];
  cells: CellSummary[];
  conditions: ConditionSummary[];
  regression: RegressionRow[];
  anova: AnovaRow[];
  posthoc: PosthocRow[];
  // Additions beyond the contract:
  /** "effective" (We = 4.133·SDx) or "errorRate" (legacy: We from the error rate, MacKenzie 1992). */
  widthMethod: "effective" | "errorRate";
  movements: number;
  /** Sequences left out for keeping fewer than 2 movements after exclusion. */
  sequencesDropped: { participant: string; condition: string; block: number; sequence: number; kept: number }[];
  regressionNominal: RegressionRow[];
  anovaMt?: AnovaRow[];
  anovaErrorRate?: AnovaRow[];
  friedman: (FriedmanResult & { measure: "errorRate" }) | null;
  missing: MissingReport;
  notes: string[];
  /** Path accuracy per kept movement that had a sampled path. */
  pathMovements?: (PathAccuracy & { participant: string; condition: string; block: number; sequence: number; trial: number })[];
}
