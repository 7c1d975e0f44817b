import { z } from "zod";
import type { TransferConfig } from "@/lib/motion/config";
import { STAGES } from "./progress";
import { inputApis } from "./batch";

/** Bodies of the session API (app/api/session/[token]/…), shared by the runner and the server. */

export const consentRequestSchema = z.strictObject({
  consentVersionId: z.number().int().positive(),
  /** SHA-256 of the text the participant saw; must equal the approved version's. */
  versionHash: z.string().regex(/^[0-9a-f]{64}$/),
  agreed: z.array(z.string().regex(/^s\d{1,3}$/)).max(50),
  typedName: z.string().trim().max(120).optional(),
  /** Only to send a copy; never stored. */
  email: z.email().max(254).optional(),
  screenShortSidePx: z.number().finite().positive().max(100_000).nullable(),
});

export const deviceRequestSchema = z.strictObject({
  inputs: z.strictObject({ motion: z.boolean(), gamepad: z.boolean(), touch: z.boolean(), finePointer: z.boolean() }),
  sampleRateHz: z.number().finite().min(0).max(5000).nullable(),
  jitterSdMs: z.number().finite().min(0).max(10_000).nullable(),
  sourceKind: z.enum(["device-motion", "generic-sensor", "gamepad", "pointer-lock", "pointer-drag", "scripted", "hid", "none"]),
  verdict: z.enum(["ok", "refused"]),
  /** The input paths the check found for the study's techniques (optional: pages before this field send none). */
  inputApis: z.array(z.enum(inputApis)).max(inputApis.length).optional(),
  /** Generic Sensor: the frequency asked (Hz). */
  requestedRateHz: z.number().finite().min(0).max(5000).nullable().optional(),
  /** New controller reports per second as the page sees them (polled once per animation frame, so at most the frame rate), when the study uses a controller. */
  controllerRateHz: z.number().finite().min(0).max(5000).nullable().optional(),
  /** Input age at drawing during the check (ms): median and 95th percentile. */
  inputAgeMedianMs: z.number().finite().min(0).max(60_000).nullable().optional(),
  inputAgeP95Ms: z.number().finite().min(0).max(60_000).nullable().optional(),
  /**
   * The sign of the accelerometer's gravity (checkGravitySign, for studies whose conditions take
   * "up" from it): "normal" (lying flat, screen up, z reads about +9.8 m/s², W3C), "inverted"
   * (the source reports it negated: the runner turns it round, `accelerometerInverted`),
   * "mirrored" (an axis disagrees with the gyroscope's: refused), or null when not checked.
   */
  gravitySign: z.enum(["normal", "inverted", "mirrored"]).nullable().optional(),
});

export const calibrationRequestSchema = z.discriminatedUnion("kind", [
  z.strictObject({
    kind: z.literal("bias"),
    biasXDegPerS: z.number().finite().min(-50).max(50),
    biasYDegPerS: z.number().finite().min(-50).max(50),
    biasZDegPerS: z.number().finite().min(-50).max(50),
    noiseSdDegPerS: z.number().finite().min(0).max(100),
    samples: z.number().int().min(0),
  }),
  z.strictObject({ kind: z.literal("card"), cardWidthPx: z.number().finite().positive().max(10_000), pixelsPerMm: z.number().finite().positive().max(100) }),
  z.strictObject({
    kind: z.literal("blind_spot"),
    distancesPx: z.array(z.number().finite().positive().max(20_000)).min(1).max(10),
    viewingDistanceMm: z.number().finite().positive().max(5000),
  }),
]);

export const progressSchema = z.strictObject({
  stage: z.enum(STAGES),
  done: z.number().int().min(0).max(10_000),
  answered: z.array(z.string().max(200)).max(500),
  breaks: z.array(z.number().int().min(0)).max(10_000),
});

export const questionnaireRequestSchema = z.strictObject({
  /** Condition label; "" for the final questionnaire. */
  condition: z.string().max(200),
  answers: z
    .array(z.strictObject({ itemId: z.string().regex(/^[a-z][a-z0-9_]{0,31}$/), valueInt: z.number().int().min(0).max(100).nullable(), valueText: z.string().max(2000).nullable() }))
    .min(1)
    .max(50),
});

export const withdrawRequestSchema = z.strictObject({ reason: z.string().trim().max(500).optional() });

export type ConsentRequest = z.infer<typeof consentRequestSchema>;
export type DeviceRequest = z.infer<typeof deviceRequestSchema>;
export type CalibrationRequest = z.infer<typeof calibrationRequestSchema>;
export type QuestionnaireRequest = z.infer<typeof questionnaireRequestSchema>;

/** What GET /api/session/[token] answers: everything the runner needs, nothing else. */
export interface SessionState {
  participantId: number;
  status: "invited" | "consented" | "in_progress" | "completed" | "withdrawn";
  study: { title: string; summary: string; compensation: string };
  design: unknown;
  /** The design's condition labels, in crossing order (conditionsOf). */
  conditions: string[];
  /** Each condition's merged transfer configuration, validated and defaulted on the server (conditionConfig). */
  configs: TransferConfig[];
  consent: { versionId: number; version: number; hash: string; body: string } | null;
  /** Condition indices in this participant's order (after consent). */
  order: number[] | null;
  planSeed: number | null;
  progress: unknown;
  calibration: {
    pixelsPerMm: number | null; viewingDistanceMm: number | null; bias: { x: number; y: number; z: number } | null;
    /** The device check found this device's accelerometer negated: every condition runs with `accelerometerInverted`. */
    accelerometerInverted: boolean;
  };
  /** Upload keys the server holds. */
  uploaded: string[];
  completionCode: string | null;
  /** The participant's pseudonymous code, shown on every screen (quoted to ask for erasure). */
  participantCode: string;
  /** A team member trying the session: shown with a "pilot" banner, kept apart from real data. */
  pilot: boolean;
  /** Return addresses of a recruitment panel: after completion (with the code filled in) and when screened out. */
  returnTo: { complete: string | null; screened: string | null };
}
