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

/** The browser input paths a sequence can use (what the stream came through). */
export const inputApis = ["generic-sensor", "device-motion", "gamepad", "pointer-lock", "pointer-move", "touch-drag", "touch-direct"] as const;
export type InputApi = (typeof inputApis)[number];

const ms = z.number().finite().min(0).max(60_000);

/**
 * Per-sequence data-quality figures, measured by the runner. The fields after `frameP99Ms` came
 * later: optional, so a page cached before them can still send what it holds.
 */
export const sequenceQualitySchema = z.strictObject({
  /** Samples per second of the stream (the technique's clock: gyroscope, controller poll or pointer events). */
  sampleRateHz: z.number().finite().min(0),
  jitterSdMs: z.number().finite().min(0),
  gaps: z.number().int().min(0),
  droppedSamples: z.number().int().min(0),
  frameP99Ms: z.number().finite().min(0).nullable(),
  /** Which browser input paths fed the stream. */
  inputApis: z.array(z.enum(inputApis)).max(inputApis.length).optional(),
  /** The sensor frequency asked of the Generic Sensor API (Hz); null for other paths. */
  requestedRateHz: z.number().finite().min(0).max(5000).nullable().optional(),
  /** Mouse: whether Pointer Lock gave raw (unadjusted) movement; null when no pointer lock was used. */
  pointerLockRaw: z.boolean().nullable().optional(),
  /** Input age at drawing: from each input event's time stamp to the frame that first drew it, median and 95th percentile (ms). */
  inputAgeMedianMs: ms.nullable().optional(),
  inputAgeP95Ms: ms.nullable().optional(),
  /** The task area (CSS px): cursor positions are kept inside it, which a replay of the stream must do too. */
  canvasWidthPx: z.number().finite().min(0).max(100_000).optional(),
  canvasHeightPx: z.number().finite().min(0).max(100_000).optional(),
  /** The device check found the accelerometer negated, and the stream ran with `accelerometerInverted` (a replay sets it too). */
  accelerometerInverted: z.boolean().optional(),
  /** Where the output started (cursor: canvas px; view: yaw, pitch deg): a replay adds its output to this (replay --start). */
  startX: z.number().finite().optional(),
  startY: z.number().finite().optional(),
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
