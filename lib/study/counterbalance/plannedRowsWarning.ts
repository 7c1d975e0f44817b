/**
 * The warning shown when the planned participant count does not fill the counterbalancing rows
 * evenly (plannedRowsWarning), or null when it does (common practice: recruit in multiples of
 * the row count). With between-subject groups, every group takes every row (betweenLevelsFor),
 * so the count must fill rows × groups.
 *
 * Cost: O(1).
 * @throws never.
 * @example plannedRowsWarning(10, 4) // "10 participants is not a multiple of the 4 orders: rows 1–2 get one more participant than rows 3–4. Plan 8 or 12."
 */
export function plannedRowsWarning(planned: number, rows: number, groups = 1): string | null {
  if (groups > 1) {
    const cycle = rows * groups;
    if (planned % cycle === 0) return null;
    const lower = planned - (planned % cycle);
    return `${planned} participants does not fill the ${groups} between-subject groups × ${rows} orders (${cycle}) evenly: some group or order gets fewer. Plan ${lower > 0 ? `${lower} or ${lower + cycle}` : cycle}.`;
  }
  if (rows <= 1 || planned % rows === 0) return null;
  const extra = planned % rows;
  const lower = planned - extra;
  const upper = lower + rows;
  const plan = lower > 0 ? `Plan ${lower} or ${upper}.` : `Plan ${upper}.`;
  const range = extra === 1 ? "row 1 gets" : `rows 1–${extra} get`;
  const rest = extra + 1 === rows ? `row ${rows}` : `rows ${extra + 1}–${rows}`;
  return `${planned} participants is not a multiple of the ${rows} orders: ${range} one more participant than ${rest}. ${plan}`;
}
