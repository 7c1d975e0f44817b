import type { StudyDesign } from "@/lib/study/design";
import type { PlannedSequence } from "./plan";

/** The stages before and after the task, in the order a session passes them. */
export const STAGES = ["info", "consent", "device", "calibration", "instructions", "task", "final", "complete"] as const;
export type Stage = (typeof STAGES)[number];

/** The runner's resumable state (participants.progress). */
export interface Progress {
  stage: Stage;
  /** Sequences finished (recorded locally), counted from the start of the plan. */
  done: number;
  /** Conditions whose per-condition questionnaire is answered. */
  answered: string[];
  /** Plan indices before which the break has been taken. */
  breaks: number[];
}

export const initialProgress = (): Progress => ({ stage: "info", done: 0, answered: [], breaks: [] });

/** What the runner shows now. */
export type RunnerStep =
  | { kind: "info" | "consent" | "device" | "calibration" | "instructions" | "final" | "complete" }
  | { kind: "sequence"; index: number }
  | { kind: "break"; index: number; seconds: number }
  | { kind: "condition-questionnaire"; condition: string };

/**
 * The step to show for a progress state (currentStep).
 *
 * Purpose: the step machine of a session, a pure function of the stored progress, so a reload
 * resumes at exactly the next unfinished thing: a pending per-condition questionnaire (after a
 * condition's last sequence), an enforced break (when the condition or block changes), else the
 * next sequence; after the plan, the final questionnaire. Source: the product's session steps.
 * Cost: O(plan).
 * @throws never.
 * @example currentStep({ stage: "task", done: 0, answered: [], breaks: [] }, plan, design) // { kind: "sequence", index: 0 }
 */
export function currentStep(progress: Progress, plan: readonly PlannedSequence[], design: StudyDesign): RunnerStep {
  if (progress.stage !== "task") return { kind: progress.stage };
  const done = Math.min(Math.max(0, progress.done), plan.length);
  const prev = done > 0 ? plan[done - 1] : undefined;
  if (prev && design.perConditionItems.length > 0 && !progress.answered.includes(prev.condition)) {
    const later = plan.slice(done).some((s) => s.conditionIndex === prev.conditionIndex);
    if (!later) return { kind: "condition-questionnaire", condition: prev.condition };
  }
  if (done >= plan.length) return { kind: "final" };
  const next = plan[done]!;
  const changes = prev !== undefined && (prev.conditionIndex !== next.conditionIndex || prev.block !== next.block);
  if (changes && design.minBreakSeconds > 0 && !progress.breaks.includes(done)) {
    return { kind: "break", index: done, seconds: design.minBreakSeconds };
  }
  return { kind: "sequence", index: done };
}

/**
 * The progress after the participant finishes the shown step (advanceProgress).
 *
 * Purpose: the transitions of the step machine; pure, so the client and the tests share it.
 * Source: the product's session steps. Cost: O(plan).
 * @throws Error "advanceProgress: nothing follows completion" from the complete stage.
 * @example advanceProgress({ stage: "info", done: 0, answered: [], breaks: [] }, plan, design).stage // "consent"
 */
export function advanceProgress(progress: Progress, plan: readonly PlannedSequence[], design: StudyDesign): Progress {
  const step = currentStep(progress, plan, design);
  const p: Progress = { ...progress, answered: [...progress.answered], breaks: [...progress.breaks] };
  switch (step.kind) {
    case "sequence":
      p.done = step.index + 1;
      return p;
    case "break":
      p.breaks.push(step.index);
      return p;
    case "condition-questionnaire":
      p.answered.push(step.condition);
      return p;
    case "complete":
      throw new Error("advanceProgress: nothing follows completion");
    default: {
      const i = STAGES.indexOf(step.kind);
      p.stage = STAGES[i + 1]!;
      return p;
    }
  }
}

/** The fraction of the plan done, 0..1, for the progress bar. */
export function progressFraction(progress: Progress, plan: readonly PlannedSequence[]): number {
  if (progress.stage === "final" || progress.stage === "complete") return 1;
  if (progress.stage !== "task" || plan.length === 0) return 0;
  return Math.min(1, progress.done / plan.length);
}
