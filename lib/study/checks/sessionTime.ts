import { conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";
import { PLANNING } from "@/lib/study/summary/designSummary";
import { checkParticipant, fittsFallbackMs, simulatedSequenceRows } from "./simulatedCells";

/** The expected time of one condition, from the simulated participant at its settings. */
export interface ConditionTime {
  label: string;
  /** Mean movement time over the condition's A×W, ms. */
  meanMovementMs: number;
  /** Seconds of measured and practice movements in one session. */
  movementSeconds: number;
  /** "simulated": sensor stream through the engine; "timing model": Fitts' law of the same person (no stream yet for this technique). */
  method: "simulated" | "timing model";
}

export interface SessionTime {
  minutes: number;
  conditions: ConditionTime[];
  /** Seconds that are not movements: sequence starts, breaks, questions, consent and calibration. */
  otherSeconds: number;
}

/**
 * Expected minutes per session (expectedSessionTime).
 *
 * Purpose: the time check of the design page. For each condition and each A×W, one sequence of
 * the simulated participant at that condition's settings (its movement times include the still
 * dwell that added latency and smoothing lengthen), capped at the trial time limit; measured
 * sequences (blocks × sequences per A×W) and practice sequences (at the mean movement time) add
 * up with the planning figures for sequence starts, the minimum breaks, questions and set-up
 * (PLANNING). Source: science.md §9 (simulated participant); PLANNING (our own planning figures).
 * Cost: conditions × |A|·|W| simulated sequences.
 * @throws never for a design that passed studyDesignSchema.
 * @example expectedSessionTime(design).minutes // 19
 */
export function expectedSessionTime(design: StudyDesign, onProgress?: (done: number, total: number) => void): SessionTime {
  const t = design.task;
  const conditions = conditionsOf(design);
  const pairs = t.amplitudes.flatMap((a) => t.widths.map((w) => ({ a, w })));
  const n = t.targetsPerRing;
  const out: ConditionTime[] = [];
  conditions.forEach((c, ci) => {
    const config = { ...conditionConfig(design, c), displayMode: t.displayMode };
    let simulated = true;
    const mts = pairs.map(({ a, w }, pi) => {
      const rows = simulatedSequenceRows(t, a, w, config, checkParticipant(config, 1000 + ci * 64 + pi), { participant: "time", condition: c.label, block: 1, sequence: 1 });
      if (!rows || rows.length === 0) {
        simulated = false;
        return Math.min(t.trialTimeLimitMs, fittsFallbackMs(config, a, w));
      }
      return Math.min(t.trialTimeLimitMs, rows.reduce((s, r) => s + r.timeMs, 0) / rows.length);
    });
    onProgress?.(ci + 1, conditions.length);
    const mean = mts.reduce((s, x) => s + x, 0) / mts.length;
    const measured = design.blocks * t.sequencesPerAW * mts.reduce((s, x) => s + x * n, 0);
    const practice = t.practiceSequences * n * mean;
    out.push({ label: c.label, meanMovementMs: mean, movementSeconds: (measured + practice) / 1000, method: simulated ? "simulated" : "timing model" });
  });
  const sequences = conditions.length * (pairs.length * t.sequencesPerAW * design.blocks + t.practiceSequences);
  const breaks = Math.max(0, conditions.length * design.blocks - 1);
  const otherSeconds =
    sequences * PLANNING.secondsPerSequenceSetup +
    breaks * design.minBreakSeconds +
    conditions.length * design.perConditionItems.length * PLANNING.secondsPerQuestionnaireItem +
    (PLANNING.setupMinutes + PLANNING.finalQuestionnaireMinutes) * 60;
  const seconds = out.reduce((s, c) => s + c.movementSeconds, 0) + otherSeconds;
  return { minutes: Math.ceil(seconds / 60), conditions: out, otherSeconds };
}
