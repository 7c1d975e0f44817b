import { z } from "zod";
import { movementKey, PATH_KEYS, type PathAccuracy } from "../analysis";
import { transferConfigSchema } from "../motion/config";
import { analysisUnitOf, geometryOf } from "../results/analysisUnit";
import type { ParticipantCalibration } from "../results/participantCalibration";
import { conditionConfig, conditionsOf, type StudyDesign } from "../study/design";
import type { TableSpec } from "./tableSpecs";

/** File name of the archive's configurations (read back by `analyze --archive`). */
export const CONFIGURATIONS_FILE = "configurations.json";

/**
 * configurations.json: what a reader needs to replay the archive's streams and analyse it as the
 * server did — the task (type, display mode, units, ring size) and each condition's full transfer
 * configuration under its number (the `c<number>` of the stream file names, the order of
 * conditions.csv). The schema is the project's own (lib/motion/config.ts, docs/configuration.md).
 */
export const configurationsSchema = z.object({
  format: z.literal("yawpoint-configurations"),
  version: z.literal(1),
  task: z.object({
    type: z.enum(["ring", "strip"]),
    displayMode: z.enum(["cursor", "view"]),
    /** The design's unit (px, mm, deg-visual, deg-view). */
    unit: z.enum(["px", "mm", "deg-visual", "deg-view"]),
    /** The trial table's unit. */
    analysisUnit: z.enum(["px", "mm", "deg"]),
    geometry: z.enum(["plane", "sphere"]),
    targetsPerRing: z.number().int(),
    amplitudes: z.array(z.number()),
    widths: z.array(z.number()),
    trialTimeLimitMs: z.number(),
  }),
  factors: z.array(z.string()),
  betweenFactors: z.array(z.string()),
  conditions: z.array(z.object({ number: z.number().int().min(1), condition: z.string(), factors: z.record(z.string(), z.string()), configuration: transferConfigSchema })),
});
export type Configurations = z.infer<typeof configurationsSchema>;

/**
 * The configurations.json of a design (configurationsOf).
 * Cost: O(conditions).
 * @throws never for a valid design.
 * @example configurationsOf(design).conditions[0].configuration.gain // 2
 */
export function configurationsOf(design: StudyDesign): Configurations {
  const t = design.task;
  return {
    format: "yawpoint-configurations",
    version: 1,
    task: {
      type: t.type, displayMode: t.displayMode, unit: t.unit, analysisUnit: analysisUnitOf(t.unit), geometry: geometryOf(t.displayMode),
      targetsPerRing: t.targetsPerRing, amplitudes: [...t.amplitudes], widths: [...t.widths], trialTimeLimitMs: t.trialTimeLimitMs,
    },
    factors: design.factors.map((f) => f.name),
    betweenFactors: design.betweenFactors.map((f) => f.name),
    conditions: conditionsOf(design).map((c) => ({ number: c.index + 1, condition: c.label, factors: { ...c.factorLevels }, configuration: conditionConfig(design, c) })),
  };
}

const PARTICIPANT_FIELD = { name: "participant", type: "string", description: "the participant's pseudonym in this archive (never the participant code)", constraints: { required: true } } as const;

/** calibration.csv: what maps each participant's streams to the screen (written with the streams only). */
export function calibrationTableSpec(): TableSpec {
  return {
    name: "calibration",
    path: "calibration.csv",
    title: "Calibration",
    description: "Each participant's calibration as the session used it to turn sensor streams into cursor or view movement: the gyroscope bias removed at rest, and the screen scale for mm and visual-degree tasks (empty when the task did not need it). Written only when the raw streams are included.",
    fields: [
      PARTICIPANT_FIELD,
      { name: "bias_x", type: "number", unit: "deg/s", description: "gyroscope bias about the device's x axis, measured at rest" },
      { name: "bias_y", type: "number", unit: "deg/s", description: "gyroscope bias about the device's y axis" },
      { name: "bias_z", type: "number", unit: "deg/s", description: "gyroscope bias about the device's z axis" },
      { name: "pixels_per_mm", type: "number", unit: "px/mm", description: "CSS pixels per millimetre from the card match (ISO/IEC 7810 ID-1 card; Li et al. 2020)" },
      { name: "viewing_distance_mm", type: "number", unit: "mm", description: "viewing distance from the blind-spot test (Li et al. 2020)" },
    ],
    primaryKey: ["participant"],
  };
}

/** calibration.csv rows. Cost: O(participants). @throws never. */
export function calibrationRows(participants: readonly { id: number }[], calibrations: ReadonlyMap<number, ParticipantCalibration>, pseudonymOf: (id: number) => string): Record<string, string | number | null>[] {
  return participants.map((p) => {
    const c = calibrations.get(p.id);
    return {
      participant: pseudonymOf(p.id),
      bias_x: c?.bias.biasXDegPerS ?? null, bias_y: c?.bias.biasYDegPerS ?? null, bias_z: c?.bias.biasZDegPerS ?? null,
      pixels_per_mm: c?.pixelsPerMm ?? null, viewing_distance_mm: c?.viewingDistanceMm ?? null,
    };
  });
}

/** paths.csv: path accuracy per movement. */
export function pathsTableSpec(unit: string): TableSpec {
  const count = (name: string, what: string) => ({ name, type: "integer" as const, description: what });
  const length = (name: string, what: string) => ({ name, type: "number" as const, unit, description: what });
  return {
    name: "paths",
    path: "paths.csv",
    title: "Path accuracy",
    description:
      "Path accuracy per movement (MacKenzie, Kauppinen & Silfverberg 2001), computed on the server from the movement's stretch of the raw stream replayed through its condition's configuration (configurations.json) with the participant's calibration; changes within a band of 5 % of W are not counted. Movements of sequences whose stream did not reproduce the recorded selections are absent. On the view sphere (view mode) distances are great-circle degrees.",
    fields: [
      PARTICIPANT_FIELD,
      { name: "condition", type: "string", description: "condition label" },
      { name: "block", type: "integer", description: "block number" },
      { name: "sequence", type: "integer", description: "sequence number" },
      { name: "trial", type: "integer", description: "movement number within the sequence" },
      count("tre", "target re-entries after the first entry"),
      count("tac", "task-axis crossings"),
      count("mdc", "movement direction changes (across the axis)"),
      count("odc", "orthogonal direction changes (along the axis)"),
      length("mv", "movement variability: sample SD of the distances from the axis"),
      length("me", "movement error: mean absolute distance from the axis"),
      length("mo", "movement offset: mean signed distance from the axis"),
    ],
    primaryKey: ["participant", "condition", "block", "sequence", "trial"],
  };
}

/** One movement's path measures, by participant id. */
export interface StoredPath {
  participantId: number;
  condition: string;
  block: number;
  sequence: number;
  trial: number;
  measures: PathAccuracy;
}

/**
 * The path measures of an archive, keyed as the analysis looks them up (movementKey with the
 * pseudonym), and paths.csv's rows (pathsForArchive).
 * Cost: O(movements with paths).
 * @throws Error from pseudonymOf for a participant without a pseudonym.
 */
export function pathsForArchive(paths: readonly StoredPath[], pseudonymOf: (id: number) => string): { byKey: Map<string, PathAccuracy>; rows: Record<string, string | number | null>[] } {
  const byKey = new Map<string, PathAccuracy>();
  const rows: Record<string, string | number | null>[] = [];
  for (const p of paths) {
    const participant = pseudonymOf(p.participantId);
    byKey.set(movementKey(participant, p.condition, p.block, p.sequence, p.trial), p.measures);
    const row: Record<string, string | number | null> = { participant, condition: p.condition, block: p.block, sequence: p.sequence, trial: p.trial };
    for (const k of PATH_KEYS) row[k] = Number.isFinite(p.measures[k]) ? p.measures[k] : null;
    rows.push(row);
  }
  return { byKey, rows };
}
