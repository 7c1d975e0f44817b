import { z } from "zod";

/** Analysis options (validated with zod at every entry point). */
export const analysisOptionsSchema = z.object({
  /** S = previous selection point ("actual") or previous target centre ("nominal"). */
  start: z.enum(["actual", "nominal"]).default("actual"),
  /** "misfire": drop movements shorter than A/2 along the axis or ending more than 2W away. */
  exclude: z.enum(["misfire", "none"]).default("misfire"),
  unit: z.enum(["px", "mm", "deg"]).default("px"),
  /** Measures to run the repeated-measures ANOVA on; "tp" always runs. */
  anova: z.array(z.enum(["tp", "mt", "errorRate"])).default(["tp"]),
  /** Name of the input, used in error messages. */
  file: z.string().default("input"),
  /** Hysteresis band for path accuracy, in the table's unit (default 0.05·W). */
  pathHysteresis: z.number().nonnegative().optional(),
});

export type AnalysisOptions = z.output<typeof analysisOptionsSchema>;
export type AnalysisOptionsInput = z.input<typeof analysisOptionsSchema>;
