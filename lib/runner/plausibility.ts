import type { StudyDesign } from "@/lib/study/design";
import { trialUnit } from "./calibration";
import type { SequenceBatch } from "./batch";
import type { PlannedSequence } from "./plan";
import { uploadKey } from "./uploadKey";

/**
 * Why an upload is implausible, or an empty list (batchProblems).
 *
 * Purpose: the server keeps only batches the runner could have produced: the key is the
 * session's own for that sequence, the sequence is in the participant's plan with the same
 * condition, A and W, the unit is the study's, there are exactly `targetsPerRing` movements
 * numbered 1..n, every hop from→to spans A (ring chord or strip distance; 0.1 % tolerance),
 * each time is in (0, trial time limit], and the stream's sample count is positive.
 * Source: interfaces.md trial table; ISO 9241-411 (n movements per sequence). Cost: O(n + plan).
 * @throws never.
 * @example batchProblems(batch, 12, plan, design) // [] for a well-formed upload
 */
export function batchProblems(batch: SequenceBatch, participantId: number, plan: readonly PlannedSequence[], design: StudyDesign): string[] {
  const problems: string[] = [];
  const planned = plan.find((s) => s.practice === batch.practice && s.block === batch.block && s.conditionIndex === batch.conditionIndex && s.sequence === batch.sequence);
  if (!planned) return [`sequence ${batch.key} is not in this session's plan`];
  if (batch.key !== uploadKey(participantId, planned)) problems.push(`key must be ${uploadKey(participantId, planned)}`);
  if (batch.condition !== planned.condition) problems.push(`condition must be "${planned.condition}"`);
  if (batch.amplitude !== planned.amplitude) problems.push(`amplitude must be ${planned.amplitude}`);
  if (batch.width !== planned.width) problems.push(`width must be ${planned.width}`);
  if (batch.unit !== trialUnit(design.task.unit)) problems.push(`unit must be ${trialUnit(design.task.unit)}`);
  const n = design.task.targetsPerRing;
  if (batch.movements.length !== n) problems.push(`a sequence has ${n} movements, got ${batch.movements.length}`);
  const limit = design.task.trialTimeLimitMs;
  batch.movements.forEach((m, i) => {
    if (m.trial !== i + 1) problems.push(`movement ${i + 1}: trial must be ${i + 1}`);
    if (!(m.time_ms > 0 && m.time_ms <= limit)) problems.push(`movement ${i + 1}: time_ms must be in (0, ${limit}]`);
    const hop = Math.hypot(m.to_x - m.from_x, m.to_y - m.from_y);
    if (Math.abs(hop - planned.amplitude) > 1e-3 * planned.amplitude) problems.push(`movement ${i + 1}: targets must be ${planned.amplitude} apart, got ${hop}`);
  });
  if (batch.stream.sampleCount < 1) problems.push("the stream has no samples");
  return problems;
}
