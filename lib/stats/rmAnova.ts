import { mixedAnova, type AnovaEffect, type AnovaFactor } from "./mixedAnova";

/** One within-subject factor: its name and its number of levels. */
export type WithinFactor = AnovaFactor;
export type RmAnovaEffect = AnovaEffect;

/**
 * Repeated-measures (within-subject) ANOVA, one-way or full factorial over any number of factors:
 * mixedAnova without between factors (each effect against its own effect × subject error).
 * `data[s][c]` is subject s in cell c; cells run over the factors' levels with the first factor
 * slowest (row-major).
 *
 * Cost: as mixedAnova.
 * @throws Error as mixedAnova (fewer than 2 subjects, a factor with fewer than 2 levels, ragged
 *   rows, a value that is not finite).
 * @example rmAnova([[1, 2], [2, 4], [3, 5]], [{name: "condition", levels: 2}])[0] // {effect: "condition", df1: 1, df2: 2, F: 28, p: 0.0339…, …}
 */
export function rmAnova(data: readonly (readonly number[])[], factors: readonly WithinFactor[]): RmAnovaEffect[] {
  if (data.length < 2) throw new Error("rmAnova requires at least 2 subjects");
  if (factors.length === 0) throw new Error("rmAnova requires at least 1 factor");
  return mixedAnova({ values: data, within: factors });
}
