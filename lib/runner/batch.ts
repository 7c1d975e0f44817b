import { z } from "zod";

const finite = z.number().finite();
/** A movement flag (interfaces.md trial table, optional columns): 0 when a client sends none. */
const flag = z.union([z.literal(0), z.literal(1)]).default(0);

/** One movement of an upload (the trial table columns that vary per movement). */
export const movementSchema = z.strictObject({
  trial: z.number().int().min(1),
  from_x: finite, from_y: finite, to_x: finite, to_y: finite,
  start_x: finite, start_y: finite, end_x: finite, end_y: finite,
  time_ms: finite,
  hit: z.union([z.literal(0), z.literal(1)]),
  timed_out: flag,
  recentered: flag,
  clutched: flag,
});

/** Per-sequence data-quality figures, measured by the runner. */
export const sequenceQualitySchema = z.strictObject({
  sampleRateHz: z.number().finite().min(0),
  jitterSdMs: z.number().finite().min(0),
  gaps: z.number().int().min(0),
  droppedSamples: z.number().int().min(0),
  frameP99Ms: z.number().finite().min(0).nullable(),
});

/**
 * One sequence upload: its movements and the gzip'd raw sample stream (replay CSV format),
 * base64. `key` makes the upload idempotent (lib/runner/uploadKey.ts).
 */
export const sequenceBatchSchema = z.strictObject({
  key: z.string().min(1).max(100),
  practice: z.boolean(),
  block: z.number().int().min(1).max(20),
  conditionIndex: z.number().int().min(0).max(4095),
  condition: z.string().min(1).max(200),
  sequence: z.number().int().min(1).max(1000),
  unit: z.enum(["px", "mm", "deg"]),
  amplitude: z.number().finite().positive(),
  width: z.number().finite().positive(),
  movements: z.array(movementSchema).min(1).max(60),
  stream: z.strictObject({
    gzipBase64: z.string().min(1).max(900_000),
    sampleCount: z.number().int().min(0).max(200_000),
  }),
  quality: sequenceQualitySchema,
});

export type SequenceBatch = z.infer<typeof sequenceBatchSchema>;
export type SequenceQuality = z.infer<typeof sequenceQualitySchema>;
export type Movement = z.infer<typeof movementSchema>;
