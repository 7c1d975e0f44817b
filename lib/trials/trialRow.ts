import { z } from "zod";

const text = z.string().min(1);
const coordinate = z.number();

/** A movement without coordinates (legacy tables): enough for width from error rate. */
export const legacyTrialRowSchema = z.object({
  participant: text,
  condition: text,
  block: z.int(),
  sequence: z.int(),
  trial: z.int().min(1),
  /** Nominal amplitude A, in the table's unit. */
  amplitude: z.number().positive(),
  /** Nominal width W, in the table's unit. */
  width: z.number().positive(),
  timeMs: z.number().nonnegative(),
  hit: z.boolean(),
  /** Level of each within-subject factor (from the f_NAME columns), by factor NAME. */
  factors: z.record(z.string().min(1), text),
  /** Level of each between-subject factor (from the b_NAME columns), by factor NAME; absent without b_ columns. */
  groups: z.record(z.string().min(1), text).optional(),
  /** Movement flags (optional columns timed_out, recentered, clutched); absent when the table has none. The movement ended by its time limit. */
  timedOut: z.boolean().optional(),
  /** A recenter happened during the movement (recentered column). */
  recentered: z.boolean().optional(),
  /** A clutch happened during the movement (clutched column). */
  clutched: z.boolean().optional(),
});

/** One movement of the trial table, as the analysis, the export and the session recorder see it. */
export const trialRowSchema = legacyTrialRowSchema.extend({
  fromX: coordinate,
  fromY: coordinate,
  toX: coordinate,
  toY: coordinate,
  startX: coordinate,
  startY: coordinate,
  endX: coordinate,
  endY: coordinate,
});

export type LegacyTrialRow = z.infer<typeof legacyTrialRowSchema>;
export type TrialRow = z.infer<typeof trialRowSchema>;

/** A row read from a file, with the 1-based line it started on. */
export type Located<R> = R & { line: number };
