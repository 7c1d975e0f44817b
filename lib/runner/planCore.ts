import { createSeededRandom } from "@/lib/motion/simulate/prng";
import type { StudyDesign } from "@/lib/study/design";

/** One sequence of a participant's session, in the order it runs. */
export interface PlannedSequence {
  practice: boolean;
  /** Block number, from 1 (practice runs in block 1, before the condition's measured sequences). */
  block: number;
  conditionIndex: number;
  condition: string;
  /** From 1, unique within participant × condition × block (practice numbered separately). */
  sequence: number;
  /** Nominal amplitude A and width W, in the design's unit. */
  amplitude: number;
  width: number;
}

/** The parts of a study design a plan depends on (besides the condition labels). */
export type PlanTask = { task: Pick<StudyDesign["task"], "amplitudes" | "widths" | "practiceSequences" | "sequencesPerAW">; blocks: number };

/**
 * A participant's session plan from the condition labels (planSequences).
 *
 * Purpose: the body of `planSession` for callers that already hold the condition labels (in
 * crossing order, as conditionsOf gives them), so the browser runner needs no schema code: for
 * each block, for each condition in the participant's counterbalanced order, the practice
 * sequences (block 1 only) and then every A×W pair `sequencesPerAW` times, the A×W order shuffled
 * within the block from a recorded seed (common practice: randomise A×W order within a block from
 * a recorded seed). The same inputs always give the same plan.
 * Source: ISO 9241-411 task structure (sequence = one run at one A×W), common practice.
 * Cost: O(blocks × conditions × pairs).
 * @throws Error "planSession requires an order that is a permutation of the condition indices" for a bad order.
 * @example planSequences(design, ["motion", "touch"], [1, 0], 7)[0] // { practice: true, block: 1, conditionIndex: 1, condition: "touch", sequence: 1, amplitude: 300, width: 30 }
 */
export function planSequences(design: PlanTask, conditions: readonly string[], order: readonly number[], seed: number): PlannedSequence[] {
  const sorted = [...order].sort((a, b) => a - b);
  if (sorted.length !== conditions.length || sorted.some((v, i) => v !== i)) {
    throw new Error("planSession requires an order that is a permutation of the condition indices");
  }
  const pairs: Array<{ amplitude: number; width: number }> = [];
  for (const amplitude of design.task.amplitudes) for (const width of design.task.widths) pairs.push({ amplitude, width });
  const rng = createSeededRandom(seed);
  const plan: PlannedSequence[] = [];
  for (let block = 1; block <= design.blocks; block++) {
    for (const ci of order) {
      const condition = conditions[ci]!;
      if (block === 1) {
        for (let p = 0; p < design.task.practiceSequences; p++) {
          const pair = pairs[p % pairs.length]!;
          plan.push({ practice: true, block, conditionIndex: ci, condition, sequence: p + 1, ...pair });
        }
      }
      const runs: Array<{ amplitude: number; width: number }> = [];
      for (let r = 0; r < design.task.sequencesPerAW; r++) runs.push(...pairs);
      for (let i = runs.length - 1; i > 0; i--) {
        const j = Math.floor(rng.uniform() * (i + 1));
        [runs[i], runs[j]] = [runs[j]!, runs[i]!];
      }
      runs.forEach((pair, i) => plan.push({ practice: false, block, conditionIndex: ci, condition, sequence: i + 1, ...pair }));
    }
  }
  return plan;
}
