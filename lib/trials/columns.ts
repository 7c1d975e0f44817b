/**
 * The trial-table column contract (one row per movement; see docs/analysis.md). Order here is the
 * order the export and the session recorder write.
 */
export const TEXT_COLUMNS = ["participant", "condition"] as const;
export const INTEGER_COLUMNS = ["block", "sequence", "trial"] as const;
export const SIZE_COLUMNS = ["amplitude", "width"] as const;
export const COORDINATE_COLUMNS = ["from_x", "from_y", "to_x", "to_y", "start_x", "start_y", "end_x", "end_y"] as const;
export const TIME_COLUMN = "time_ms";
export const HIT_COLUMN = "hit";

/** Every required column, in the order they are written. */
export const TRIAL_COLUMNS = [
  ...TEXT_COLUMNS,
  ...INTEGER_COLUMNS,
  ...SIZE_COLUMNS,
  ...COORDINATE_COLUMNS,
  TIME_COLUMN,
  HIT_COLUMN,
] as const;

/**
 * Optional movement flags (interfaces.md): 1 when the trial ended by its time limit, or a recenter
 * or clutch happened during the movement, else 0. Written after `hit`; read when present.
 */
export const FLAG_COLUMNS = ["timed_out", "recentered", "clutched"] as const;

/** The required columns when coordinates are not available (legacy tables: width from error rate). */
export const LEGACY_TRIAL_COLUMNS = [...TEXT_COLUMNS, ...INTEGER_COLUMNS, ...SIZE_COLUMNS, TIME_COLUMN, HIT_COLUMN] as const;

/** A column named f_NAME holds the level of within-subject factor NAME. */
export const FACTOR_PREFIX = "f_";

/** A column named b_NAME holds the level of between-subject factor NAME (constant within a participant). */
export const BETWEEN_PREFIX = "b_";

export type FlagColumn = (typeof FLAG_COLUMNS)[number];

export type TrialColumn = (typeof TRIAL_COLUMNS)[number];
