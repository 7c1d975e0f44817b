import { z } from "zod";
import { transferConfigSchema } from "@/lib/motion/config";
import { taskSchema } from "./design";

/**
 * What "try this level" runs: a condition's full transfer configuration (base and levels merged,
 * defaults filled) and the task fields the runner draws with. No participant, no consent, no
 * recording: the request body of POST /api/studies/[id]/try and the stored setup of a try.
 */
export const trySetupSchema = z.strictObject({
  label: z.string().trim().min(1).max(200),
  config: transferConfigSchema,
  task: taskSchema.pick({ type: true, displayMode: true, unit: true, targetsPerRing: true, amplitudes: true, widths: true, selection: true, dwellMs: true, trialTimeLimitMs: true }),
});
export type TrySetup = z.output<typeof trySetupSchema>;
export type TrySetupInput = z.input<typeof trySetupSchema>;

/** How long a try (and its short link) works: one hour. */
export const TRY_TTL_MS = 3600_000;
