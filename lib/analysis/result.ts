import type { AnovaEffect, FriedmanResult, IntervalSummary } from "../stats";
import type { ExclusionCounts } from "./applyExclusions";
import type { ExclusionRule } from "./options";
import type { PathAccuracy } from "./pathAccuracy";

/**
 * The analysis result. The keys up to `posthoc` are the public JSON contract of `analyze --json`
 * (docs/analysis.md); the rest are additions. A statistic that cannot be computed is null (never a
 * number) and the row's `note` says why; the one rule for missing and non-finite values is `rule`.
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
  /** Errors (misses and kept time-outs) among the kept movements, as a fraction. */
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
  /** Movements removed by the exclusion rules. */
  excluded: number;
  /** Time-outs kept (counted as errors). */
  timedOut: number;
  /** Mean path accuracy over the kept movements that have a path. */
  path?: PathSummary;
}

/** Means of the path-accuracy measures over some movements. */
export type PathSummary = PathAccuracy & { movements: number };

export interface CellSummary {
  participant: string;
  condition: string;
  tp: number;
  mt: number;
  errorRate: number;
  we: number;
  ide: number;
  sequences: number;
  /** The participant's between-factor levels (b_ columns); absent without them. */
  groups?: Record<string, string>;
  /** Mean over the cell's sequences that have path measures. */
  path?: PathSummary;
}

export interface ConditionSummary {
  condition: string;
  n: number;
  tp: IntervalSummary;
  mt: IntervalSummary;
  errorRate: IntervalSummary;
  /** Levels of the f_ factors for this condition. */
  factors: Record<string, string>;
  /** Path accuracy: the mean over participants of their cell means (mean of means). */
  path?: PathSummary & { participants: number };
}

/** A condition summarised within one group of participants (mixed designs). */
export interface GroupConditionSummary {
  /** The group's between-factor levels. */
  groups: Record<string, string>;
  /** The levels joined by " / " (e.g. "novice / left"). */
  group: string;
  condition: string;
  n: number;
  tp: IntervalSummary;
  mt: IntervalSummary;
  errorRate: IntervalSummary;
}

export interface RegressionRow {
  condition: string;
  /** ms. */
  intercept: number | null;
  /** ms/bit. */
  slope: number | null;
  r2: number | null;
  /** A×W points in the fit. */
  points: number;
  note: string | null;
}

export type AnovaRow = AnovaEffect;

export interface PosthocRow {
  a: string;
  b: string;
  meanDiff: number;
  t: number | null;
  df: number;
  p: number | null;
  pHolm: number | null;
  dz: number | null;
  note: string | null;
}

/** A paired comparison of two conditions within one group (mixed designs). */
export type GroupPosthocRow = PosthocRow & { group: string };

/** Welch's t between two groups in one condition (mixed designs). */
export interface BetweenPosthocRow {
  condition: string;
  /** The two groups' labels. */
  a: string;
  b: string;
  meanDiff: number;
  t: number | null;
  df: number | null;
  p: number | null;
  pHolm: number | null;
  /** Cohen's d with the root mean square of the two SDs. */
  d: number | null;
  note: string | null;
}

/** Who was left out of the inferential statistics, and why. */
export interface MissingReport {
  /** Participants left out of every test (ANOVAs, post hoc, Friedman) for lacking a condition. */
  participantsExcluded: number;
  participantsIncluded: number;
  cells: { participant: string; condition: string }[];
  participants: { participant: string; reason: string }[];
}

/** The between-subject groups (b_ columns). */
export interface GroupReport {
  /** Between factors in column order. */
  factors: string[];
  groups: { group: string; groups: Record<string, string>; participants: number; complete: number }[];
}

export interface AnalysisResult {
  unit: "px" | "mm" | "deg";
  start: "actual" | "nominal";
  exclude: ExclusionRule;
  excluded: number;
  sequences: SequenceSummary[];
  cells: CellSummary[];
  conditions: ConditionSummary[];
  regression: RegressionRow[];
  anova: AnovaRow[];
  posthoc: PosthocRow[];
  // Additions beyond the contract:
  /** How coordinates were read: points in a plane, or view directions on the sphere. */
  geometry: "plane" | "sphere";
  /** Movements removed by each rule (their sum is `excluded`). */
  exclusions: ExclusionCounts;
  /** Flags whose movements were removed. */
  dropFlagged: string[];
  /** Time-outs kept and counted as errors. */
  timeoutsKept: number;
  /** "effective" (We = 4.133·SDx) or "errorRate" (legacy: We from the error rate, MacKenzie 1992). */
  widthMethod: "effective" | "errorRate";
  movements: number;
  /** Sequences left out of every summary, with the reason. */
  sequencesDropped: { participant: string; condition: string; block: number; sequence: number; kept: number; reason: string }[];
  regressionNominal: RegressionRow[];
  anovaMt?: AnovaRow[];
  anovaErrorRate?: AnovaRow[];
  friedman: (FriedmanResult & { measure: "errorRate"; note: string | null }) | null;
  groups: GroupReport | null;
  conditionsByGroup?: GroupConditionSummary[];
  posthocWithinGroups?: GroupPosthocRow[];
  posthocBetweenGroups?: BetweenPosthocRow[];
  missing: MissingReport;
  /** The one rule for values that cannot be computed, as applied here. */
  rule: string;
  notes: string[];
  /** Path accuracy per kept movement that had a path. */
  pathMovements?: (PathAccuracy & { participant: string; condition: string; block: number; sequence: number; trial: number })[];
}
