import { BETWEEN_PREFIX, TRIAL_COLUMNS, FACTOR_PREFIX, FLAG_COLUMNS } from "../trials/columns";

/** Table Schema field types used here (Frictionless Table Schema v1, "Types and formats"). */
export type FieldType = "string" | "number" | "integer" | "boolean" | "datetime";

/** One column of an archive table: what the data package, the codebook and the CSV header say. */
export interface FieldSpec {
  name: string;
  type: FieldType;
  /** Unit of the values ("px", "ms", "bits/s", "1" for fractions); omitted for labels and counts. */
  unit?: string;
  description: string;
  constraints?: { required?: boolean; minimum?: number; maximum?: number; enum?: (string | number)[] };
}

/** One CSV table of the archive. */
export interface TableSpec {
  name: string;
  path: string;
  title: string;
  description: string;
  fields: FieldSpec[];
  primaryKey?: string[];
}

const PARTICIPANT: FieldSpec = { name: "participant", type: "string", description: "the participant's pseudonym in this archive (never the participant code)", constraints: { required: true } };
const CONDITION: FieldSpec = { name: "condition", type: "string", description: "condition label: the levels of the within-subject factors joined by ' / '", constraints: { required: true } };

const betweenFields = (betweenNames: readonly string[]): FieldSpec[] =>
  betweenNames.map((b) => ({ name: BETWEEN_PREFIX + b, type: "string", description: `level of the between-subject factor "${b}" of this participant (the same in every row of a participant)` }));

const factorFields = (factorNames: readonly string[]): FieldSpec[] =>
  factorNames.map((f) => ({ name: FACTOR_PREFIX + f, type: "string", description: `level of the within-subject factor "${f}" in this condition` }));

const TRIAL_FIELD_TEXT: Record<(typeof TRIAL_COLUMNS)[number], Omit<FieldSpec, "name" | "unit"> & { unit?: "coord" | "ms" }> = {
  participant: { type: PARTICIPANT.type, description: PARTICIPANT.description, constraints: { required: true } },
  condition: { type: CONDITION.type, description: CONDITION.description, constraints: { required: true } },
  block: { type: "integer", description: "block number, from 1", constraints: { minimum: 0 } },
  sequence: { type: "integer", description: "sequence number, unique within participant × condition × block" },
  trial: { type: "integer", description: "movement number within the sequence, from 1 (the first selection only starts the sequence and has no row)", constraints: { minimum: 1 } },
  amplitude: { type: "number", unit: "coord", description: "nominal amplitude A (for rings the chord between successive targets)" },
  width: { type: "number", unit: "coord", description: "nominal target width W" },
  from_x: { type: "number", unit: "coord", description: "x of the centre of the target the movement started from" },
  from_y: { type: "number", unit: "coord", description: "y of the centre of the target the movement started from" },
  to_x: { type: "number", unit: "coord", description: "x of the centre of the target aimed at" },
  to_y: { type: "number", unit: "coord", description: "y of the centre of the target aimed at" },
  start_x: { type: "number", unit: "coord", description: "x where the movement started: the previous selection point" },
  start_y: { type: "number", unit: "coord", description: "y where the movement started: the previous selection point" },
  end_x: { type: "number", unit: "coord", description: "x of the selection point" },
  end_y: { type: "number", unit: "coord", description: "y of the selection point" },
  time_ms: { type: "number", unit: "ms", description: "movement time from the previous selection to this one" },
  hit: { type: "integer", description: "1 if the selection fell inside the target, else 0", constraints: { enum: [0, 1] } },
};

const FLAG_FIELD_TEXT: Record<(typeof FLAG_COLUMNS)[number], string> = {
  timed_out: "1 if the trial time limit ended the movement (the selection point is where the aim was then), else 0",
  recentered: "1 if the participant recentred during the movement, else 0",
  clutched: "1 if the clutch was engaged at some moment of the movement, else 0",
};

/** trials.csv: the trial table of the public interface, one row per movement, practice left out. */
export function trialsTableSpec(unit: string, factorNames: readonly string[], betweenNames: readonly string[] = []): TableSpec {
  return {
    name: "trials",
    path: "trials.csv",
    title: "Movements",
    description: `One row per movement (practice left out), the trial-table format that \`npm run analyze\` reads. Coordinates, amplitude and width in ${unit}.`,
    fields: [
      ...TRIAL_COLUMNS.map((name) => {
        const { unit: u, ...rest } = TRIAL_FIELD_TEXT[name];
        return { name, ...rest, ...(u ? { unit: u === "coord" ? unit : u } : {}) };
      }),
      ...FLAG_COLUMNS.map((name): FieldSpec => ({ name, type: "integer", description: FLAG_FIELD_TEXT[name], constraints: { enum: [0, 1] } })),
      ...factorFields(factorNames),
      ...betweenFields(betweenNames),
    ],
    primaryKey: ["participant", "condition", "block", "sequence", "trial"],
  };
}

/** sequences.csv: ISO 9241-411 measures per sequence. */
export function sequencesTableSpec(unit: string): TableSpec {
  return {
    name: "sequences",
    path: "sequences.csv",
    title: "Sequences",
    description: "ISO 9241-411 measures per sequence (one participant × condition × block × A×W run).",
    fields: [
      PARTICIPANT, CONDITION,
      { name: "block", type: "integer", description: "block number" },
      { name: "sequence", type: "integer", description: "sequence number" },
      { name: "amplitude", type: "number", unit, description: "nominal amplitude A" },
      { name: "width", type: "number", unit, description: "nominal width W" },
      { name: "id", type: "number", unit: "bits", description: "nominal index of difficulty log2(A/W + 1)" },
      { name: "n", type: "integer", description: "movements kept" },
      { name: "excluded", type: "integer", description: "movements removed by the exclusion rule" },
      { name: "error_rate", type: "number", unit: "1", description: "misses among the kept movements, as a fraction 0..1", constraints: { minimum: 0, maximum: 1 } },
      { name: "ae", type: "number", unit, description: "effective amplitude: mean movement distance along the task axis" },
      { name: "sdx", type: "number", unit, description: "sample SD of the end points along the task axis" },
      { name: "we", type: "number", unit, description: "effective width 4.133 × sdx" },
      { name: "ide", type: "number", unit: "bits", description: "effective index of difficulty log2(ae/we + 1)" },
      { name: "mt", type: "number", unit: "ms", description: "mean movement time" },
      { name: "tp", type: "number", unit: "bits/s", description: "throughput ide / mt" },
    ],
    primaryKey: ["participant", "condition", "block", "sequence"],
  };
}

/** cells.csv: mean of means per participant × condition. */
export function cellsTableSpec(unit: string, factorNames: readonly string[], betweenNames: readonly string[] = []): TableSpec {
  return {
    name: "cells",
    path: "cells.csv",
    title: "Participant × condition means",
    description: "The mean of a participant's sequence values in one condition (mean of means); the statistics run on these.",
    fields: [
      PARTICIPANT, CONDITION, ...factorFields(factorNames), ...betweenFields(betweenNames),
      { name: "tp", type: "number", unit: "bits/s", description: "mean throughput over the participant's sequences in this condition" },
      { name: "mt", type: "number", unit: "ms", description: "mean movement time" },
      { name: "error_rate", type: "number", unit: "1", description: "mean error rate, fraction 0..1", constraints: { minimum: 0, maximum: 1 } },
      { name: "we", type: "number", unit, description: "mean effective width" },
      { name: "ide", type: "number", unit: "bits", description: "mean effective index of difficulty" },
      { name: "sequences", type: "integer", description: "sequences averaged" },
    ],
    primaryKey: ["participant", "condition"],
  };
}

/** Path accuracy means per condition (paths.csv has them per movement); empty without streams. */
const PATH_MEAN_FIELDS = (unit: string): FieldSpec[] => [
  { name: "path_movements", type: "integer", description: "movements with path measures (their means follow; empty when none)" },
  ...(["tre", "tac", "mdc", "odc"] as const).map((k): FieldSpec => ({ name: `path_${k}`, type: "number", description: `mean ${k.toUpperCase()} per movement: the mean over participants of their means in this condition` })),
  ...(["mv", "me", "mo"] as const).map((k): FieldSpec => ({ name: `path_${k}`, type: "number", ...(unit ? { unit } : {}), description: `mean ${k.toUpperCase()} per movement: the mean over participants of their means in this condition` })),
];

const interval = (prefix: string, unit: string, what: string): FieldSpec[] => [
  { name: `${prefix}_mean`, type: "number", unit, description: `mean ${what} over participants` },
  { name: `${prefix}_sd`, type: "number", unit, description: `sample SD of ${what} over participants` },
  { name: `${prefix}_ci95_low`, type: "number", unit, description: `lower end of the 95 % t interval of the mean ${what}` },
  { name: `${prefix}_ci95_high`, type: "number", unit, description: `upper end of the 95 % t interval of the mean ${what}` },
];

/** conditions.csv: per-condition summaries over participants. */
export function conditionsTableSpec(factorNames: readonly string[], unit = ""): TableSpec {
  return {
    name: "conditions",
    path: "conditions.csv",
    title: "Conditions",
    description: "Each condition summarised over participants' cell means, with 95 % t intervals and the Fitts regression MT = a + b·IDe over the A×W means.",
    fields: [
      CONDITION, ...factorFields(factorNames),
      { name: "n", type: "integer", description: "participants" },
      ...interval("tp", "bits/s", "throughput"),
      ...interval("mt", "ms", "movement time"),
      ...interval("error_rate", "1", "error rate (fraction)"),
      { name: "regression_intercept", type: "number", unit: "ms", description: "intercept a of MT on IDe" },
      { name: "regression_slope", type: "number", unit: "ms/bit", description: "slope b of MT on IDe" },
      { name: "regression_r2", type: "number", unit: "1", description: "coefficient of determination of the fit" },
      ...PATH_MEAN_FIELDS(unit),
    ],
    primaryKey: ["condition"],
  };
}

/** participants.csv: who took part, coarsened. */
export function participantsTableSpec(betweenNames: readonly string[], includeDates: boolean): TableSpec {
  return {
    name: "participants",
    path: "participants.csv",
    title: "Participants",
    description: "One row per participant with data: pseudonym, counterbalancing row, between-subject factors and the final questionnaire in coarse categories.",
    fields: [
      PARTICIPANT,
      { name: "status", type: "string", description: "completed, in_progress or consented (withdrawn participants are left out)" },
      { name: "cb_row", type: "integer", description: "counterbalancing row (0-based)" },
      { name: "condition_order", type: "string", description: "the participant's condition labels in order, joined by ' | '" },
      { name: "protocol_version", type: "integer", description: "the approved protocol version the participant consented under and ran (empty: none recorded)" },
      { name: "excluded", type: "integer", description: "1 if the team excluded the participant (their movements are not in trials.csv; the reason is in exclusions.csv), else 0", constraints: { enum: [0, 1] } },
      ...betweenNames.map((b): FieldSpec => ({ name: `between_${b}`, type: "string", description: `level of the between-subject factor "${b}"` })),
      { name: "age_band", type: "string", description: "age in wide bands: under 18, 18-29, 30-44, 45-64, 65+ (empty: not asked or not answered)" },
      { name: "handedness", type: "string", description: "left, right or mixed" },
      { name: "experience", type: "string", description: "earlier experience with motion aiming: none, some or much" },
      { name: "session_minutes", type: "number", unit: "min", description: "time from session start to completion, rounded to whole minutes" },
      ...(includeDates
        ? [
            { name: "started_at", type: "datetime", description: "session start (UTC)" } as FieldSpec,
            { name: "completed_at", type: "datetime", description: "session completion (UTC)" } as FieldSpec,
          ]
        : []),
    ],
    primaryKey: ["participant"],
  };
}

/** exclusions.csv: what the team left out of trials.csv and the analysis, with the reason. */
export function exclusionsTableSpec(): TableSpec {
  return {
    name: "exclusions",
    path: "exclusions.csv",
    title: "Exclusions",
    description: "One row per exclusion the research team made: a whole participant or one sequence, with the reason given and the movements it removed. Those movements are not in trials.csv.",
    fields: [
      PARTICIPANT,
      { name: "scope", type: "string", description: "participant (every sequence of the participant) or sequence (one sequence)", constraints: { enum: ["participant", "sequence"] } },
      { ...CONDITION, constraints: undefined, description: "for a sequence: its condition label; empty for a participant" },
      { name: "block", type: "integer", description: "for a sequence: its block" },
      { name: "sequence", type: "integer", description: "for a sequence: its number within participant × condition × block" },
      { name: "reason", type: "string", description: "the research team's reason, as they gave it" },
      { name: "movements", type: "integer", description: "measured movements the exclusion removed" },
    ],
  };
}

/** questionnaires.csv: per-condition rating items (and free text when chosen). */
export function questionnairesTableSpec(includeDates: boolean): TableSpec {
  return {
    name: "questionnaires",
    path: "questionnaires.csv",
    title: "Questionnaire answers",
    description: "Answers to the per-condition rating items (and free-text answers when the researcher chose to include them); the final questionnaire's categories are in participants.csv.",
    fields: [
      PARTICIPANT,
      { name: "condition", type: "string", description: "condition label; empty for the final questionnaire" },
      { name: "item", type: "string", description: "item id as in the study design" },
      { name: "value", type: "integer", description: "rating on the item's scale (1 = the low label)" },
      { name: "text", type: "string", description: "free-text answer (only when included)" },
      includeDates
        ? { name: "answered_at", type: "datetime", description: "when the answer was given (UTC)" }
        : { name: "answered_s", type: "number", unit: "s", description: "seconds from the participant's session start to the answer" },
    ],
    primaryKey: ["participant", "condition", "item"],
  };
}
