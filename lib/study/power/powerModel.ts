import { conditionsOf, type StudyDesign } from "@/lib/study/design";
import type { ConditionNoise } from "./conditionNoise";
import type { PowerModel } from "./simulatePower";

/** What the researcher states for the power curve. */
export interface PowerRequest {
  /** Name of the within-subject factor whose levels are compared. */
  factor: string;
  smallestDifference: number;
  spreadBetweenPeople: number;
  alpha: number;
}

/**
 * The Monte Carlo model of a design's main comparison (powerModelFor): each condition's level of
 * the chosen factor and its cell SD from stage one. Cost: O(conditions).
 * @throws Error "powerModelFor: no within-subject factor NAME" / "… needs at least 2 levels".
 */
export function powerModelFor(design: StudyDesign, request: PowerRequest, noise: readonly ConditionNoise[]): PowerModel {
  const factor = design.factors.find((f) => f.name === request.factor);
  if (!factor) throw new Error(`powerModelFor: no within-subject factor ${request.factor}`);
  const levelLabels = factor.levels.map((l) => l.label);
  const conditions = conditionsOf(design);
  const present = levelLabels.filter((l) => conditions.some((c) => c.factorLevels[factor.name] === l));
  if (present.length < 2) throw new Error(`powerModelFor: ${request.factor} needs at least 2 levels among the conditions`);
  return {
    mainLevelOfCondition: conditions.map((c) => present.indexOf(c.factorLevels[factor.name]!)),
    levels: present.length,
    cellSd: conditions.map((_, i) => noise[i]!.sdTp),
    smallestDifference: request.smallestDifference,
    spreadBetweenPeople: request.spreadBetweenPeople,
    alpha: request.alpha,
  };
}
