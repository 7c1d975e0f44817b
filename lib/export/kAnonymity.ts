/** The outcome of a k-anonymity check. */
export interface KAnonymityResult {
  /** The size of the smallest group of rows sharing every quasi-identifier (0 for no rows). */
  k: number;
  /** Groups smaller than the threshold, each as its quasi-identifier values and size. */
  smallGroups: { values: Record<string, string>; size: number }[];
  quasiIdentifiers: string[];
}

/**
 * k-anonymity of a table over its quasi-identifiers (kAnonymity).
 *
 * Purpose: warn before open data lets someone single out a participant by combining coarse
 * attributes. A table is k-anonymous when every combination of quasi-identifier values that occurs
 * is shared by at least k rows (Sweeney 2002, "k-anonymity: a model for protecting privacy",
 * IJUFKS 10(5):557–570, §2). Empty values count as a value of their own.
 * Cost: O(rows × quasi-identifiers).
 * @throws never.
 * @example kAnonymity([{ a: "x" }, { a: "x" }, { a: "y" }], ["a"], 2).k // 1
 */
export function kAnonymity(rows: readonly Record<string, string | number | null | undefined>[], quasiIdentifiers: readonly string[], threshold = 5): KAnonymityResult {
  const groups = new Map<string, { values: Record<string, string>; size: number }>();
  for (const row of rows) {
    const values = Object.fromEntries(quasiIdentifiers.map((q) => [q, row[q] === null || row[q] === undefined ? "" : String(row[q])]));
    const key = JSON.stringify(quasiIdentifiers.map((q) => values[q]));
    const g = groups.get(key);
    if (g) g.size++;
    else groups.set(key, { values, size: 1 });
  }
  const sizes = [...groups.values()];
  return {
    k: sizes.length === 0 ? 0 : Math.min(...sizes.map((g) => g.size)),
    smallGroups: sizes.filter((g) => g.size < threshold).sort((a, b) => a.size - b.size),
    quasiIdentifiers: [...quasiIdentifiers],
  };
}
