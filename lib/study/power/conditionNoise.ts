import { analyzeTrials } from "@/lib/analysis/analyzeTrials";
import { parseTransferConfig } from "@/lib/motion/config";
import { checkParticipant, simulatedSequenceRows } from "@/lib/study/checks/simulatedCells";
import { conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";
import type { TrialRow } from "@/lib/trials/trialRow";

/** How much one person's throughput in one condition varies from the finite movements they make. */
export interface ConditionNoise {
  label: string;
  /** Mean and SD over the simulated people of the cell's throughput (mean of means), bits/s. */
  meanTp: number;
  sdTp: number;
  /** "simulated" at this condition's settings, or "stand-in" (the task at default motion settings) for a technique the simulated participant does not move yet. */
  method: "simulated" | "stand-in";
}

/**
 * Cell-to-cell variation of throughput per condition (conditionNoise).
 *
 * Purpose: stage one of the power curve. For each condition, `people` simulated participants
 * (same timing and endpoint model, different seeds) run every measured sequence of that condition
 * (blocks × sequences per A×W × A×W) at the condition's settings through the engine; the
 * project's analysis (analyzeTrials: ISO 9241-411 We, IDe, TP per sequence, mean of means per
 * cell, misfires excluded) gives each person's cell throughput; their mean and SD are returned.
 * Source: science.md §1 (measures, aggregation), §9 (simulated participant).
 * Cost: conditions × people × sequences simulated sequences.
 * @throws never for a design that passed studyDesignSchema.
 * @example conditionNoise(design, 8, 1)[0].sdTp // ≈ 0.1 bits/s for 4 A×W of 13 movements
 */
export function conditionNoise(design: StudyDesign, people: number, seed: number, onProgress?: (done: number, total: number) => void): ConditionNoise[] {
  const t = design.task;
  const conditions = conditionsOf(design);
  const pairs = t.amplitudes.flatMap((a) => t.widths.map((w) => ({ a, w })));
  const total = conditions.length + 1;
  let standIn: { meanTp: number; sdTp: number } | null = null;

  const simulate = (label: string, config: ReturnType<typeof parseTransferConfig>, ci: number): { meanTp: number; sdTp: number } | null => {
    const rows: TrialRow[] = [];
    for (let p = 0; p < people; p++) {
      for (let b = 1; b <= design.blocks; b++) {
        for (let s = 0; s < t.sequencesPerAW; s++) {
          for (const [pi, { a, w }] of pairs.entries()) {
            const r = simulatedSequenceRows(t, a, w, config, checkParticipant(config, seed * 7919 + ci * 104729 + p * 1009 + b * 101 + s * 31 + pi), { participant: `p${p}`, condition: label, block: b, sequence: s * pairs.length + pi + 1 });
            if (r === null) return null;
            rows.push(...r);
          }
        }
      }
    }
    const cells = analyzeTrials(rows, { start: "actual", exclude: "misfire", unit: "px" }).cells.map((c) => c.tp).filter(Number.isFinite);
    const mean = cells.reduce((x, y) => x + y, 0) / cells.length;
    const sd = Math.sqrt(cells.reduce((x, y) => x + (y - mean) ** 2, 0) / (cells.length - 1));
    return { meanTp: mean, sdTp: sd };
  };

  const out = conditions.map((c, ci): ConditionNoise => {
    const config = { ...conditionConfig(design, c), displayMode: t.displayMode };
    const r = simulate(c.label, config, ci);
    onProgress?.(ci + 1, total);
    if (r) return { label: c.label, ...r, method: "simulated" };
    standIn ??= simulate("stand-in", parseTransferConfig({ displayMode: t.displayMode }), conditions.length);
    return { label: c.label, meanTp: standIn!.meanTp, sdTp: standIn!.sdTp, method: "stand-in" };
  });
  onProgress?.(total, total);
  return out;
}
