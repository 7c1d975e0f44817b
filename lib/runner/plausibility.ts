import type { StudyDesign } from "@/lib/study/design";
import type { Point } from "@/lib/task/point";
import { trialUnit } from "./calibration";
import type { SequenceBatch } from "./batch";
import { isInsideTarget, sequenceLayout, type SequenceLayout } from "./geometry";
import type { PlannedSequence } from "./plan";
import { uploadKey } from "./uploadKey";

/**
 * The shortest median movement time of a sequence a person can produce, ms. Aimed movements
 * with a selection take well over 100 ms even at the easiest indices of difficulty (Fitts'
 * law intercepts in ISO 9241-9 studies are about 100–400 ms; Soukoreff & MacKenzie 2004, from
 * memory). A median, not every movement: a slip of the finger (two presses in quick
 * succession) is genuine data that the analysis's misfire rule removes, not a made-up sequence.
 */
export const MIN_MEDIAN_MOVEMENT_MS = 100;

/** How far a coordinate may differ from the plan's (relative to A): other browsers' sin/cos may differ in the last bits. */
const RELATIVE_TOLERANCE = 1e-6;

/** A check of an upload that failed: which rule, and what was wrong. */
export interface Problem {
  rule: string;
  message: string;
}

const problem = (rule: string, message: string): Problem => ({ rule, message });

/** Whether two points agree to within `tol` in each coordinate. */
const same = (a: Point, b: Point, tol: number): boolean => Math.abs(a.x - b.x) <= tol && Math.abs(a.y - b.y) <= tol;

/** The middle value (mean of the two middle ones for an even count). */
function medianOf(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/**
 * The layout a planned sequence is shown in (plannedLayout): the design's task type and ring
 * size at the plan's A and W, on the view sphere in view mode (science.md §1 "View mode").
 * @throws Error from sequenceLayout for a layout no display can show.
 */
export function plannedLayout(design: StudyDesign, planned: Pick<PlannedSequence, "amplitude" | "width">): SequenceLayout {
  return sequenceLayout(design.task.type, design.task.targetsPerRing, planned.amplitude, planned.width, design.task.displayMode === "view" ? "sphere" : "plane");
}

/**
 * Why an upload's movements are implausible, or an empty list (batchProblems).
 *
 * Purpose: the server keeps only sequences the runner could have recorded from a person aiming
 * at the participant's own plan. Each failed rule is named:
 * - `plan`: the sequence is in the participant's plan (from the study's seed and their order);
 * - `key`, `condition`, `amplitude`, `width`, `unit`: as planned;
 * - `movements`: exactly `targetsPerRing` movements numbered 1..n (ISO 9241-411: n + 1
 *   selections give n movements);
 * - `targets`: from/to are the planned layout's target centres in visiting order (the ring's
 *   visiting order k·(n+1)/2 mod n or the strips; on the sphere in view mode);
 * - `start`: each movement starts where the previous one's selection was (interfaces.md:
 *   start_x/y is the previous selection point);
 * - `hit`: hit agrees with the end point and the target's width (within W/2; great-circle
 *   angle in view mode), except within a rounding margin of the edge;
 * - `time`: each time in (0, trial time limit], and the sequence's median at least
 *   MIN_MEDIAN_MOVEMENT_MS.
 * The stream is checked against the movements by streamProblems once it is decompressed.
 * Source: interfaces.md trial table; ISO 9241-411:2012 task definitions; science.md §1.
 * Cost: O(n + plan).
 * @throws never.
 * @example batchProblems(batch, 12, plan, design) // [] for an upload the runner made
 */
export function batchProblems(batch: SequenceBatch, participantId: number, plan: readonly PlannedSequence[], design: StudyDesign): Problem[] {
  const planned = plan.find((s) => s.practice === batch.practice && s.block === batch.block && s.conditionIndex === batch.conditionIndex && s.sequence === batch.sequence);
  if (!planned) return [problem("plan", `sequence ${batch.key} is not in this session's plan`)];
  const problems: Problem[] = [];
  if (batch.key !== uploadKey(participantId, planned)) problems.push(problem("key", `key must be ${uploadKey(participantId, planned)}`));
  if (batch.condition !== planned.condition) problems.push(problem("condition", `condition must be "${planned.condition}"`));
  if (batch.amplitude !== planned.amplitude) problems.push(problem("amplitude", `amplitude must be ${planned.amplitude}`));
  if (batch.width !== planned.width) problems.push(problem("width", `width must be ${planned.width}`));
  if (batch.unit !== trialUnit(design.task.unit)) problems.push(problem("unit", `unit must be ${trialUnit(design.task.unit)}`));
  const n = design.task.targetsPerRing;
  if (batch.movements.length !== n) problems.push(problem("movements", `a sequence has ${n} movements, got ${batch.movements.length}`));
  if (problems.length > 0) return problems;

  const layout = plannedLayout(design, planned);
  const tol = RELATIVE_TOLERANCE * planned.amplitude;
  const limit = design.task.trialTimeLimitMs;
  const w = planned.width;
  batch.movements.forEach((m, i) => {
    const at = `movement ${i + 1}`;
    if (m.trial !== i + 1) problems.push(problem("movements", `${at}: trial must be ${i + 1}`));
    const from = layout.order[i]!, to = layout.order[i + 1]!;
    if (!same({ x: m.from_x, y: m.from_y }, from, tol) || !same({ x: m.to_x, y: m.to_y }, to, tol)) {
      problems.push(problem("targets", `${at}: from/to must be the planned targets (${from.x}, ${from.y}) → (${to.x}, ${to.y})`));
    }
    const prev = batch.movements[i - 1];
    if (prev && !same({ x: m.start_x, y: m.start_y }, { x: prev.end_x, y: prev.end_y }, tol)) problems.push(problem("start", `${at}: must start where movement ${i} ended`));
    const end = { x: m.end_x, y: m.end_y };
    // the runner decides with the same function; near the edge another browser's last bit may decide otherwise
    const clearlyIn = isInsideTarget(layout.type, to, layout.axis, end, w * (1 - RELATIVE_TOLERANCE), layout.surface);
    const clearlyOut = !isInsideTarget(layout.type, to, layout.axis, end, w * (1 + RELATIVE_TOLERANCE), layout.surface);
    if ((clearlyIn && m.hit !== 1) || (clearlyOut && m.hit !== 0)) problems.push(problem("hit", `${at}: hit must be ${clearlyIn ? 1 : 0} for this end point and width ${w}`));
    if (!(m.time_ms > 0 && m.time_ms <= limit)) problems.push(problem("time", `${at}: time_ms must be in (0, ${limit}]`));
  });
  const median = medianOf(batch.movements.map((m) => m.time_ms));
  if (median < MIN_MEDIAN_MOVEMENT_MS) problems.push(problem("time", `the median movement time is ${median} ms; a person needs at least ${MIN_MEDIAN_MOVEMENT_MS} ms`));
  return problems;
}
