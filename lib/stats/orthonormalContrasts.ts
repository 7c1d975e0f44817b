/**
 * Orthonormal Helmert contrasts for k levels: a k × (k − 1) matrix whose columns are orthogonal,
 * of unit length and sum to zero (column j: 1 in rows 0..j−1, −j in row j, scaled by 1/√(j(j+1))).
 * Sphericity tests and corrections are invariant to the choice of orthonormal contrasts
 * (Mauchly 1940; Greenhouse & Geisser 1959).
 *
 * Cost: O(k²).
 * @throws Error when k < 2.
 * @example orthonormalContrasts(2) // [[0.7071…], [-0.7071…]]
 */
export function orthonormalContrasts(k: number): number[][] {
  if (!Number.isInteger(k) || k < 2) throw new Error(`orthonormalContrasts requires at least 2 levels, got ${k}`);
  const rows = Array.from({ length: k }, () => new Array<number>(k - 1).fill(0));
  for (let j = 1; j < k; j++) {
    const scale = 1 / Math.sqrt(j * (j + 1));
    for (let i = 0; i < j; i++) rows[i]![j - 1] = scale;
    rows[j]![j - 1] = -j * scale;
  }
  return rows;
}
