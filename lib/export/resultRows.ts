import type { AnalysisResult, SequenceSummary } from "../analysis/result";

type Row = Record<string, string | number | null>;
const num = (x: number | null | undefined): number | null => (x !== null && x !== undefined && Number.isFinite(x) ? x : null);

/** sequences.csv rows from an analysis's sequences, one at a time (sequenceRows); keys are sequencesTableSpec's columns. Cost: O(sequences). @throws never. */
export function* sequenceRows(sequences: readonly SequenceSummary[]): Generator<Row> {
  for (const s of sequences) yield ({
    participant: s.participant, condition: s.condition, block: s.block, sequence: s.sequence,
    amplitude: s.amplitude, width: s.width, id: num(s.id), n: s.n, excluded: s.excluded,
    error_rate: num(s.errorRate), ae: num(s.ae), sdx: num(s.sdx), we: num(s.we), ide: num(s.ide), mt: num(s.mt), tp: num(s.tp),
  });
}

/** cells.csv rows (cellRows), with the f_NAME levels of each condition. Cost: O(cells). @throws never. */
export function cellRows(result: AnalysisResult, factorNames: readonly string[], betweenNames: readonly string[] = []): Row[] {
  const levels = new Map(result.conditions.map((c) => [c.condition, c.factors]));
  return result.cells.map((c) => ({
    participant: c.participant, condition: c.condition,
    ...Object.fromEntries(factorNames.map((f) => [`f_${f}`, levels.get(c.condition)?.[f] ?? null])),
    ...Object.fromEntries(betweenNames.map((b) => [`b_${b}`, c.groups?.[b] ?? null])),
    tp: num(c.tp), mt: num(c.mt), error_rate: num(c.errorRate), we: num(c.we), ide: num(c.ide), sequences: c.sequences,
  }));
}

/** conditions.csv rows (conditionRows), with each condition's Fitts regression. Cost: O(conditions). @throws never. */
export function conditionRows(result: AnalysisResult, factorNames: readonly string[]): Row[] {
  const fits = new Map(result.regression.map((r) => [r.condition, r]));
  return result.conditions.map((c) => {
    const fit = fits.get(c.condition);
    return {
      condition: c.condition,
      ...Object.fromEntries(factorNames.map((f) => [`f_${f}`, c.factors[f] ?? null])),
      n: c.n,
      tp_mean: num(c.tp.mean), tp_sd: num(c.tp.sd), tp_ci95_low: num(c.tp.ci95[0]), tp_ci95_high: num(c.tp.ci95[1]),
      mt_mean: num(c.mt.mean), mt_sd: num(c.mt.sd), mt_ci95_low: num(c.mt.ci95[0]), mt_ci95_high: num(c.mt.ci95[1]),
      error_rate_mean: num(c.errorRate.mean), error_rate_sd: num(c.errorRate.sd), error_rate_ci95_low: num(c.errorRate.ci95[0]), error_rate_ci95_high: num(c.errorRate.ci95[1]),
      regression_intercept: fit ? num(fit.intercept) : null, regression_slope: fit ? num(fit.slope) : null, regression_r2: fit ? num(fit.r2) : null,
      path_movements: c.path?.movements ?? null,
      path_tre: num(c.path?.tre), path_tac: num(c.path?.tac), path_mdc: num(c.path?.mdc), path_odc: num(c.path?.odc),
      path_mv: num(c.path?.mv), path_me: num(c.path?.me), path_mo: num(c.path?.mo),
    };
  });
}
