/**
 * Sum-to-zero (deviation, "effect") coding of a factor with l levels: row i is the code of level i,
 * e_i for i < l − 1 and (−1, …, −1) for the last level, so every column sums to zero. With this
 * coding the intercept of a full-factorial model is the unweighted mean of the cell means, which
 * makes each effect's hypothesis the Type III one for unequal group sizes (R's contr.sum, which
 * afex sets for its ANOVAs; Maxwell & Delaney, "Designing Experiments and Analyzing Data", ch. 7).
 *
 * Cost: O(l²).
 * @throws Error when l < 2.
 * @example sumToZeroCoding(3) // [[1, 0], [0, 1], [-1, -1]]
 */
export function sumToZeroCoding(levels: number): number[][] {
  if (!Number.isInteger(levels) || levels < 2) throw new Error(`sumToZeroCoding requires at least 2 levels, got ${levels}`);
  return Array.from({ length: levels }, (_, i) => Array.from({ length: levels - 1 }, (_, j) => (i === levels - 1 ? -1 : i === j ? 1 : 0)));
}
