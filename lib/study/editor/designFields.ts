import type { StudyDesignInput } from "@/lib/study/design";

type TaskKey = keyof NonNullable<StudyDesignInput["task"]>;
type DesignKey = keyof StudyDesignInput;

/**
 * Labels of every study-design field the design form offers (the design form reads its labels
 * from here; the coverage test compares these keys with studyDesignSchema and taskSchema, so a
 * new design field without a place in the form fails it).
 */
export const designFieldLabels: Record<Exclude<DesignKey, "task">, string> & { task: Record<TaskKey, string> } = {
  baseConfig: "Base settings (every condition starts from these)",
  factors: "Within-subject factors",
  conditionSubset: "Use only some of the crossed conditions",
  betweenFactors: "Between-subject factors",
  blocks: "Blocks",
  minBreakSeconds: "Minimum break (s)",
  perConditionItems: "Questions after each condition",
  finalQuestionnaire: "Questions at the end",
  counterbalancing: "Counterbalancing",
  plannedParticipants: "Planned participants (N)",
  requireTypedName: "Participants type their name to sign the consent",
  eraseOnWithdrawal: "Erase a participant's data when they withdraw",
  compensation: "Compensation (shown in invitations)",
  minSampleRateHz: "Lowest motion sensor rate accepted (Hz)",
  task: {
    type: "Task type",
    displayMode: "Display mode",
    unit: "Unit",
    amplitudes: "Amplitudes (A)",
    widths: "Widths (W)",
    targetsPerRing: "Targets per ring (odd)",
    sequencesPerAW: "Sequences per A×W",
    practiceSequences: "Practice sequences",
    selection: "Selection",
    dwellMs: "Dwell time (ms)",
    trialTimeLimitMs: "Time limit per trial (ms)",
  },
};
