import { z } from "zod";
import { FLAG_COLUMNS } from "../trials/columns";

/** Exclusion rules (docs/analysis.md): misfires, MT outliers, both, or none. */
export const EXCLUSION_RULES = ["misfire", "mt3sd", "misfire+mt3sd", "none"] as const;
export type ExclusionRule = (typeof EXCLUSION_RULES)[number];

/** Analysis options (validated with zod at every entry point). */
export const analysisOptionsSchema = z
  .object({
    /** S = previous selection point ("actual") or previous target centre ("nominal"). */
    start: z.enum(["actual", "nominal"]).default("actual"),
    /**
     * "misfire": drop movements shorter than A/2 along the axis or ending more than 2W away;
     * "mt3sd": drop movement times beyond the mean ± 3 SD of the participant × condition;
     * "misfire+mt3sd": misfires first, then the MT rule on what remains; "none".
     */
    exclude: z.enum(EXCLUSION_RULES).default("misfire"),
    /** Flagged movements to remove (by default none: a time-out is kept and counts as an error). */
    dropFlagged: z.array(z.enum(FLAG_COLUMNS)).default([]),
    /** "plane": coordinates are points; "sphere": they are view directions (yaw, pitch in degrees). */
    geometry: z.enum(["plane", "sphere"]).default("plane"),
    unit: z.enum(["px", "mm", "deg"]).default("px"),
    /** Measures to run the ANOVA on; "tp" always runs. */
    anova: z.array(z.enum(["tp", "mt", "errorRate"])).default(["tp"]),
    /** Name of the input, used in error messages. */
    file: z.string().default("input"),
    /** Hysteresis band for path accuracy, in the table's unit (default 0.05·W). */
    pathHysteresis: z.number().nonnegative().optional(),
  })
  .refine((o) => o.geometry === "plane" || o.unit === "deg", { path: ["geometry"], message: "the sphere geometry needs unit deg (view directions in degrees)" });

export type AnalysisOptions = z.output<typeof analysisOptionsSchema>;
export type AnalysisOptionsInput = z.input<typeof analysisOptionsSchema>;
