import type { MovementColumns } from "../trials/movementColumns";
import type { TrialRow } from "../trials/trialRow";

/** A stored movement (the trials table's columns, practice rows already left out). */
export interface TrialRecord extends MovementColumns {
  participant_id: number;
  condition: string;
  block: number;
  sequence: number;
  trial: number;
  amplitude: number;
  width: number;
  hit: number | boolean;
  /** Movement flags (trials.timed_out, recentered, clutched). */
  timed_out: number | boolean;
  recentered: number | boolean;
  clutched: number | boolean;
}

const truthy = (v: number | boolean): boolean => v === true || Number(v) === 1;

/**
 * A stored movement as the trial-table row the analysis reads (trialRowFromRecord), labelled
 * with `participant` (a code on the results page, a pseudonym in an archive) and the condition's
 * factor levels (f_NAME columns).
 * Cost: O(factors).
 * @throws never.
 * @example trialRowFromRecord(rec, "P-7Q2K9A", { technique: "motion" }).factors.technique // "motion"
 */
export function trialRowFromRecord(rec: TrialRecord, participant: string, factors: Record<string, string>): TrialRow {
  return {
    participant,
    condition: rec.condition,
    block: Number(rec.block),
    sequence: Number(rec.sequence),
    trial: Number(rec.trial),
    amplitude: Number(rec.amplitude),
    width: Number(rec.width),
    fromX: Number(rec.from_x),
    fromY: Number(rec.from_y),
    toX: Number(rec.to_x),
    toY: Number(rec.to_y),
    startX: Number(rec.start_x),
    startY: Number(rec.start_y),
    endX: Number(rec.end_x),
    endY: Number(rec.end_y),
    timeMs: Number(rec.time_ms),
    hit: truthy(rec.hit),
    timedOut: truthy(rec.timed_out),
    recentered: truthy(rec.recentered),
    clutched: truthy(rec.clutched),
    factors,
  };
}
