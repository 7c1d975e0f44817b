import { conditionsOf, type StudyDesign } from "@/lib/study/design";
import { planSequences, type PlannedSequence } from "./planCore";

export { planSequences, type PlannedSequence, type PlanTask } from "./planCore";

/**
 * A participant's session plan (planSession).
 *
 * Purpose: every sequence the runner shows, in order: for each block, for each condition in the
 * participant's counterbalanced order, the practice sequences (block 1 only) and then every A×W
 * pair `sequencesPerAW` times, the A×W order shuffled within the block from a recorded seed
 * (common practice: randomise A×W order within a block from a recorded seed). The same inputs
 * always give the same plan, so the server can check an upload against it.
 * Source: ISO 9241-411 task structure (sequence = one run at one A×W), common practice.
 * Cost: O(blocks × conditions × pairs).
 * @throws Error "planSession requires an order that is a permutation of the condition indices" for a bad order.
 * @example planSession(design, [1, 0], 7)[0] // { practice: true, block: 1, conditionIndex: 1, condition: "…", sequence: 1, amplitude: 300, width: 30 }
 */
export function planSession(design: StudyDesign, order: readonly number[], seed: number): PlannedSequence[] {
  return planSequences(design, conditionsOf(design).map((c) => c.label), order, seed);
}

/**
 * The seed of a participant's A×W order (planSeedFor): the study's recorded counterbalancing
 * seed combined with the participant's id, so the server and the browser build the same plan.
 * Source: common practice (randomise from a recorded seed). Cost: O(1).
 * @throws never.
 * @example planSeedFor(1, 12) // 7931
 */
export function planSeedFor(studySeed: number, participantId: number): number {
  return (Math.imul(studySeed, 7919) + participantId) >>> 0;
}
