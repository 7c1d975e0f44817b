import { analyzeTrials } from "../analysis/analyzeTrials";
import type { AnalysisResult } from "../analysis/result";
import { conditionsOf, type StudyDesign } from "../study/design";
import type { TrialRow } from "../trials/trialRow";
import { analysisUnitOf } from "./analysisUnit";
import { awMeans, type AwMean } from "./awMeans";
import { endpointScatter, type EndpointCloud, type ExclusionCounts } from "./endpointScatter";
import { learningCurve, type LearningPoint } from "./learningCurve";
import { progressCounts, type ParticipantStatus, type ProgressCounts } from "./progressCounts";
import { trialRowFromRecord, type TrialRecord } from "./trialRecord";

export interface ResultsParticipant {
  id: number;
  code: string;
  status: ParticipantStatus;
  cbRow: number | null;
}

/** What the results page shows (GET /api/studies/[id]/results). */
export interface ResultsView {
  unit: "px" | "mm" | "deg";
  conditions: { label: string; factors: Record<string, string> }[];
  progress: ProgressCounts;
  plannedParticipants: number;
  participants: (ResultsParticipant & { movements: number })[];
  /** The analysis (interfaces.md JSON and its additions, path movements left out); null without data. */
  analysis: Omit<AnalysisResult, "pathMovements"> | null;
  analysisError: string | null;
  awMeans: AwMean[];
  learningCurve: LearningPoint[];
  endpoints: EndpointCloud[];
  exclusions: ExclusionCounts & {
    rule: string;
    withdrawn: string[];
    sequencesDropped: AnalysisResult["sequencesDropped"];
    missing: AnalysisResult["missing"] | null;
  };
}

/**
 * Everything the results page plots (buildResultsView), from the stored movements (practice
 * left out) of the participants who have not withdrawn: the analysis of lib/analysis with the
 * study's factors as f_ columns, the A×W means, the learning curve, end points on the task
 * axis, and the exclusions with their reasons.
 * Cost: O(movements) plus the statistics.
 * @throws never: analysis errors come back in `analysisError`.
 * @example buildResultsView(design, participants, records).analysis?.conditions.length // 4
 */
export function buildResultsView(design: StudyDesign, participants: readonly ResultsParticipant[], records: readonly TrialRecord[]): ResultsView {
  const unit = analysisUnitOf(design.task.unit);
  const conditions = conditionsOf(design);
  const levelsOf = new Map(conditions.map((c) => [c.label, c.factorLevels]));
  const codeOf = new Map(participants.map((p) => [p.id, p.code]));
  const withdrawn = new Set(participants.filter((p) => p.status === "withdrawn").map((p) => p.id));
  const movementsOf = new Map<number, number>();
  const rows: TrialRow[] = [];
  for (const r of records) {
    if (withdrawn.has(r.participant_id)) continue;
    const code = codeOf.get(r.participant_id);
    if (code === undefined) continue;
    movementsOf.set(r.participant_id, (movementsOf.get(r.participant_id) ?? 0) + 1);
    rows.push(trialRowFromRecord(r, code, levelsOf.get(r.condition) ?? {}));
  }
  let analysis: AnalysisResult | null = null;
  let analysisError: string | null = null;
  let clouds: EndpointCloud[] = [];
  let exclusions: ExclusionCounts = { short: 0, far: 0, removed: 0 };
  if (rows.length > 0) {
    try {
      analysis = analyzeTrials(rows, { start: "actual", exclude: "misfire", unit, anova: ["tp", "mt", "errorRate"] });
      ({ clouds, exclusions } = endpointScatter(rows, analysis.sequences));
    } catch (e) {
      analysisError = (e as Error).message;
      analysis = null;
    }
  }
  const { pathMovements: _paths, ...shown } = analysis ?? { pathMovements: undefined };
  return {
    unit,
    conditions: conditions.map((c) => ({ label: c.label, factors: c.factorLevels })),
    progress: progressCounts(participants),
    plannedParticipants: design.plannedParticipants,
    participants: participants.map((p) => ({ ...p, movements: movementsOf.get(p.id) ?? 0 })),
    analysis: analysis ? (shown as Omit<AnalysisResult, "pathMovements">) : null,
    analysisError,
    awMeans: analysis ? awMeans(analysis.sequences) : [],
    learningCurve: analysis ? learningCurve(analysis.sequences) : [],
    endpoints: clouds,
    exclusions: {
      ...exclusions,
      rule: "misfire: distance along the task axis < A/2, or the selection more than 2W from the target centre (common practice); misses are kept",
      withdrawn: participants.filter((p) => p.status === "withdrawn").map((p) => p.code),
      sequencesDropped: analysis?.sequencesDropped ?? [],
      missing: analysis?.missing ?? null,
    },
  };
}
