import { nominalIndexOfDifficulty } from "@/lib/task";
import { conditionsOf, type StudyDesign } from "../design";

export type DesignSummary = {
  conditions: { index: number; label: string; factorLevels: Record<string, string> }[];
  /** every A×W pair with its nominal ID (bits), the same in every condition */
  difficulties: { amplitude: number; width: number; id: number }[];
  sequencesPerCondition: number;
  movementsPerSequence: number;
  /** measured movements (practice excluded) per participant */
  trialsPerParticipant: number;
  practiceTrialsPerParticipant: number;
  /** planning estimate, minutes, rounded up */
  estimatedMinutes: number;
  totalTrials: number;
};

/** Planning assumptions of our own, stated in the summary UI. */
export const PLANNING = { secondsPerMovement: 1.2, secondsPerSequenceSetup: 5, secondsPerQuestionnaireItem: 8, setupMinutes: 6, finalQuestionnaireMinutes: 2 } as const;

/**
 * Design summary (designSummary): the counts and the time a design implies, for the designer and
 * the reviewer. Per condition and block there are |A|·|W|·sequencesPerAW sequences of
 * targetsPerRing movements each (ISO 9241-411 ring: n targets give n movements, the first
 * selection only starts the sequence; common practice); practice sequences run once per
 * condition. Minutes are a planning estimate from PLANNING plus the minimum breaks between
 * conditions and blocks.
 *
 * Cost: O(conditions + |A|·|W|).
 * @throws never for a design that passed studyDesignSchema.
 * @example designSummary(design2x2).trialsPerParticipant // 208 (4 conditions × 4 A×W × 1 × 13)
 */
export function designSummary(design: StudyDesign): DesignSummary {
  const conditions = conditionsOf(design);
  const t = design.task;
  const difficulties = t.amplitudes.flatMap((a) => t.widths.map((w) => ({ amplitude: a, width: w, id: nominalIndexOfDifficulty(a, w) })));
  const sequencesPerCondition = difficulties.length * t.sequencesPerAW * design.blocks;
  const movementsPerSequence = t.targetsPerRing;
  const trialsPerParticipant = conditions.length * sequencesPerCondition * movementsPerSequence;
  const practiceTrialsPerParticipant = conditions.length * t.practiceSequences * movementsPerSequence;
  const sequences = conditions.length * (sequencesPerCondition + t.practiceSequences);
  const breaks = Math.max(0, conditions.length * design.blocks - 1);
  const seconds =
    (trialsPerParticipant + practiceTrialsPerParticipant) * PLANNING.secondsPerMovement +
    sequences * PLANNING.secondsPerSequenceSetup +
    breaks * design.minBreakSeconds +
    conditions.length * design.perConditionItems.length * PLANNING.secondsPerQuestionnaireItem +
    (PLANNING.setupMinutes + PLANNING.finalQuestionnaireMinutes) * 60;
  return {
    conditions: conditions.map((c) => ({ index: c.index, label: c.label, factorLevels: c.factorLevels })),
    difficulties,
    sequencesPerCondition,
    movementsPerSequence,
    trialsPerParticipant,
    practiceTrialsPerParticipant,
    estimatedMinutes: Math.ceil(seconds / 60),
    totalTrials: trialsPerParticipant * design.plannedParticipants,
  };
}
