import { buildResultWithKeep } from "../analysis/buildResult";
import { analysisOptionsSchema, type ExclusionRule } from "../analysis/options";
import type { PathAccuracy } from "../analysis/pathAccuracy";
import type { AnalysisResult } from "../analysis/result";
import { TrialAccumulator } from "../analysis/trialAccumulator";
import { conditionsOf, type StudyDesign } from "../study/design";
import type { FlagColumn } from "../trials/columns";
import type { TrialRow } from "../trials/trialRow";
import { TrialTableError } from "../trials/trialTableError";
import { analysisUnitOf, geometryOf } from "./analysisUnit";
import { awMeans, type AwMean } from "./awMeans";
import { endpointScatter, type EndpointCloud, type MisfireReasons } from "./endpointScatter";
import { learningCurve, type LearningPoint } from "./learningCurve";
import { progressCounts, type ParticipantStatus, type ProgressCounts } from "./progressCounts";
import { trialRowFromRecord, type TrialRecord } from "./trialRecord";

export interface ResultsParticipant {
  id: number;
  code: string;
  status: ParticipantStatus;
  cbRow: number | null;
  /** Levels of the study's between-subject factors. */
  betweenLevels: Record<string, string>;
  /** "real" unless a pilot or simulated participant the team included. */
  kind?: "real" | "pilot" | "simulated";
  /** The protocol version the participant ran (null: from before versions, or a pilot). */
  protocolVersion?: number | null;
}

/** One exclusion by the team, as the results and the methods text report it. */
export interface ResearcherExclusion {
  /** Participant code (results) or pseudonym (archive). */
  participant: string;
  scope: "participant" | "sequence";
  condition: string | null;
  block: number | null;
  sequence: number | null;
  reason: string;
  /** Measured movements it removed. */
  movements: number;
}

/** The exclusion choices a researcher makes on the results page. */
export interface ResultsOptions {
  exclude: ExclusionRule;
  dropFlagged: FlagColumn[];
  /** The team's exclusions of participants and sequences (lib/data/exclusions.ts), already left out of `records`: reported with the results. */
  researcherExclusions?: readonly ResearcherExclusion[];
}

/** How the path measures of a study's sequences stand (computed from the streams, kept in the database). */
export interface PathStatus {
  /** Non-practice sequences with a stored stream. */
  sequences: number;
  /** Sequences whose path measures are known (computed now or before). */
  computed: number;
  /** Sequences still to compute (the time budget ran out; the next request goes on). */
  pending: number;
  /** Sequences whose stream could not give path measures, with the reason. */
  notComputable: { participant: string; condition: string; block: number; sequence: number; reason: string }[];
}

/** What the results page shows (GET /api/studies/[id]/results). */
export interface ResultsView {
  unit: "px" | "mm" | "deg";
  geometry: "plane" | "sphere";
  options: ResultsOptions;
  conditions: { label: string; factors: Record<string, string> }[];
  betweenFactors: { name: string; levels: string[] }[];
  progress: ProgressCounts;
  plannedParticipants: number;
  participants: (ResultsParticipant & { movements: number })[];
  /** The analysis (interfaces.md JSON and its additions, path movements left out); null without data. */
  analysis: Omit<AnalysisResult, "pathMovements"> | null;
  analysisError: string | null;
  awMeans: AwMean[];
  learningCurve: LearningPoint[];
  endpoints: EndpointCloud[];
  /** Path accuracy's progress; null when it was not asked for. */
  paths: PathStatus | null;
  exclusions: MisfireReasons & {
    rule: string;
    withdrawn: string[];
    /** The team's exclusions (participants or sequences, with their reasons), already left out of the movements. */
    byResearcher: ResearcherExclusion[];
    /** Pilot and simulated participants the team included. */
    pilotsIncluded: string[];
    sequencesDropped: AnalysisResult["sequencesDropped"];
    missing: AnalysisResult["missing"] | null;
  };
}

const RULE_TEXT: Record<ExclusionRule, string> = {
  misfire: "misfire: distance along the task axis < A/2, or the selection more than 2W from the target centre (common practice); misses are kept",
  mt3sd: "MT outlier: a movement time further than 3 SD from the mean of the participant × condition (common practice); misses are kept",
  "misfire+mt3sd": "misfires first (distance along the axis < A/2, or more than 2W from the target centre), then MT outliers beyond the participant × condition's mean ± 3 SD (common practice); misses are kept",
  none: "none: every movement is kept",
};

/**
 * Everything the results page plots (buildResultsView), from the stored movements (practice
 * left out) of the participants who have not withdrawn: the analysis of lib/analysis with the
 * study's factors as f_ columns, each participant's between-subject levels as b_ columns, view
 * directions on the sphere in view mode, the chosen exclusion rule and flags, and path accuracy
 * when `pathMeasures` (by movementKey) are given; the A×W means, the learning curve, end points on
 * the task axis (the movements the analysis kept), and the exclusions with their reasons.
 * Cost: O(movements) plus the statistics.
 * @throws never: analysis errors come back in `analysisError`.
 * @example buildResultsView(design, participants, records).analysis?.conditions.length // 4
 */
export function buildResultsView(
  design: StudyDesign,
  participants: readonly ResultsParticipant[],
  records: readonly TrialRecord[],
  options: ResultsOptions = { exclude: "misfire", dropFlagged: [] },
  paths?: { measures: ReadonlyMap<string, PathAccuracy>; status: PathStatus },
): ResultsView {
  const pathMeasures = paths?.measures;
  const unit = analysisUnitOf(design.task.unit);
  const geometry = geometryOf(design.task.displayMode);
  const conditions = conditionsOf(design);
  const levelsOf = new Map(conditions.map((c) => [c.label, c.factorLevels]));
  const byId = new Map(participants.map((p) => [p.id, p]));
  const withdrawn = new Set(participants.filter((p) => p.status === "withdrawn").map((p) => p.id));
  const betweenNames = design.betweenFactors.map((f) => f.name);
  const movementsOf = new Map<number, number>();
  const rows: TrialRow[] = [];
  let analysisError: string | null = null;
  for (const r of records) {
    if (withdrawn.has(r.participant_id)) continue;
    const p = byId.get(r.participant_id);
    if (p === undefined) continue;
    movementsOf.set(r.participant_id, (movementsOf.get(r.participant_id) ?? 0) + 1);
    const row = trialRowFromRecord(r, p.code, levelsOf.get(r.condition) ?? {});
    if (betweenNames.length > 0) {
      const lacking = betweenNames.find((b) => !p.betweenLevels[b]);
      if (lacking !== undefined) analysisError ??= `participant ${p.code} is in no group of the between factor ${lacking}`;
      row.groups = p.betweenLevels;
    }
    rows.push(row);
  }
  let analysis: AnalysisResult | null = null;
  let clouds: EndpointCloud[] = [];
  let exclusions: MisfireReasons = { short: 0, far: 0, removed: 0 };
  if (rows.length > 0 && analysisError === null) {
    try {
      const opts = analysisOptionsSchema.parse({ start: "actual", exclude: options.exclude, dropFlagged: options.dropFlagged, unit, geometry, anova: ["tp", "mt", "errorRate"], file: "trials" });
      const acc = new TrialAccumulator(opts);
      for (const row of rows) acc.add(row);
      const built = buildResultWithKeep(acc, opts, [...design.factors.map((f) => f.name), ...betweenNames], pathMeasures);
      analysis = built.result;
      ({ clouds, exclusions } = endpointScatter(rows, analysis.sequences, { keep: built.keep, geometry }));
    } catch (e) {
      analysisError = e instanceof TrialTableError ? e.detail : (e as Error).message;
      analysis = null;
    }
  }
  const { pathMovements: _paths, ...shown } = analysis ?? { pathMovements: undefined };
  return {
    unit,
    geometry,
    options,
    conditions: conditions.map((c) => ({ label: c.label, factors: c.factorLevels })),
    betweenFactors: design.betweenFactors.map((f) => ({ name: f.name, levels: [...f.levels] })),
    progress: progressCounts(participants),
    plannedParticipants: design.plannedParticipants,
    participants: participants.map((p) => ({ ...p, movements: movementsOf.get(p.id) ?? 0 })),
    analysis: analysis ? (shown as Omit<AnalysisResult, "pathMovements">) : null,
    analysisError,
    awMeans: analysis ? awMeans(analysis.sequences) : [],
    learningCurve: analysis ? learningCurve(analysis.sequences) : [],
    endpoints: clouds,
    paths: paths?.status ?? null,
    exclusions: {
      ...exclusions,
      rule: RULE_TEXT[options.exclude] + (options.dropFlagged.length ? `; flagged movements removed: ${options.dropFlagged.join(", ")}` : "; time-outs kept and counted as errors"),
      withdrawn: participants.filter((p) => p.status === "withdrawn").map((p) => p.code),
      byResearcher: [...(options.researcherExclusions ?? [])],
      pilotsIncluded: participants.filter((p) => p.kind !== undefined && p.kind !== "real").map((p) => p.code),
      sequencesDropped: analysis?.sequencesDropped ?? [],
      missing: analysis?.missing ?? null,
    },
  };
}
