import { inverse, Matrix } from "ml-matrix";
import { fUpperTail } from "./fUpperTail";
import { orthonormalContrasts } from "./orthonormalContrasts";
import { sphericity, type MauchlyResult } from "./sphericity";
import { sumToZeroCoding } from "./sumToZeroCoding";

/** A factor of the design: its name and number of levels. */
export interface AnovaFactor {
  name: string;
  levels: number;
}

/** The data and design of a mixed (split-plot) ANOVA. */
export interface MixedAnovaInput {
  /**
   * values[s][c]: participant s in within cell c. Cells run over the within factors' levels with
   * the first factor slowest (row-major); without within factors each row holds one value.
   */
  values: readonly (readonly number[])[];
  within: readonly AnovaFactor[];
  /** Between-subject factors (default none). */
  between?: readonly AnovaFactor[];
  /** groups[s]: participant s's between cell, row-major over `between` (first slowest). */
  groups?: readonly number[];
  /** Factor names in the order effect names list them (default: between, then within). */
  order?: readonly string[];
}

/**
 * One effect row. Statistics that cannot be computed are null and `note` says why; ε and the
 * sphericity test do not apply to between effects (null) and are 1 / null for one-df within effects.
 */
export interface AnovaEffect {
  /** Factor names joined by ":" in the order given (e.g. "technique:gain"). */
  effect: string;
  df1: number;
  df2: number;
  F: number | null;
  p: number | null;
  epsilonGG: number | null;
  pGG: number | null;
  partialEta2: number | null;
  /** Huynh–Feldt ε as R reports it (Lecoutre 1991), uncapped; pHF uses min(1, ε). */
  epsilonHF: number | null;
  pHF: number | null;
  /** p with the lower-bound ε = 1/df1 (Greenhouse & Geisser 1959's conservative test); within effects only. */
  pLowerBound: number | null;
  generalizedEta2: number | null;
  ssEffect: number;
  ssError: number;
  mauchly: MauchlyResult | null;
  /** "between" (no within factor), "within" (no between factor) or "mixed". */
  kind: "between" | "within" | "mixed";
  note: string | null;
}

/** Kronecker product of two matrices given as row arrays. */
function kron(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): number[][] {
  const out: number[][] = [];
  for (const ra of a) for (const rb of b) {
    const row: number[] = [];
    for (const x of ra) for (const y of rb) row.push(x * y);
    out.push(row);
  }
  return out;
}

/** Contrast matrix (cells × p) of the within part of an effect: Helmert for its factors, averaging for the rest. */
function withinContrasts(within: readonly AnovaFactor[], members: readonly number[]): number[][] {
  let c: number[][] = [[1]];
  within.forEach((f, i) => {
    c = kron(c, members.includes(i) ? orthonormalContrasts(f.levels) : Array.from({ length: f.levels }, () => [1 / Math.sqrt(f.levels)]));
  });
  return c;
}

/**
 * Design matrix row (length g) of a between cell under sum-to-zero coding, and the term each
 * column belongs to (a bit mask of between factors). Column order: Kronecker over factors of
 * [1, code columns].
 */
function designRow(between: readonly AnovaFactor[], codes: readonly number[][][], cell: number): number[] {
  const levels: number[] = [];
  let rest = cell;
  for (let i = between.length - 1; i >= 0; i--) {
    levels[i] = rest % between[i]!.levels;
    rest = Math.floor(rest / between[i]!.levels);
  }
  let row = [1];
  between.forEach((_, i) => {
    const next: number[] = [];
    const part = [1, ...codes[i]![levels[i]!]!];
    for (const x of row) for (const y of part) next.push(x * y);
    row = next;
  });
  return row;
}

function columnTerms(between: readonly AnovaFactor[]): number[] {
  let terms = [0];
  between.forEach((f, i) => {
    const next: number[] = [];
    for (const t of terms) for (let j = 0; j < f.levels; j++) next.push(j === 0 ? t : t | (1 << i));
    terms = next;
  });
  return terms;
}

/** Non-empty subsets of `count` factors, by size, then by the positions of their factors in `rank`. */
function effectSubsets(count: number, rank: readonly number[]): number[][] {
  const all: number[][] = [];
  for (let mask = 1; mask < 1 << count; mask++) {
    const s: number[] = [];
    for (let i = 0; i < count; i++) if (mask & (1 << i)) s.push(i);
    all.push(s.sort((a, b) => rank[a]! - rank[b]!));
  }
  return all.sort((x, y) => {
    if (x.length !== y.length) return x.length - y.length;
    for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return rank[x[i]!]! - rank[y[i]!]!;
    return 0;
  });
}

interface WithinPart {
  /** Coefficients B̂ (g × p) of the scores on the design matrix. */
  coefficients: Matrix;
  /** Error SSP matrix of the scores (p × p), pooled within groups. */
  sspe: Matrix;
  p: number;
}

/**
 * Mixed-design (split-plot) ANOVA over any number of between- and within-subject factors, with
 * Type III sums of squares for unequal group sizes, as R's car::Anova and afex compute it
 * (the multivariate linear model's univariate tests; Maxwell & Delaney, "Designing Experiments and
 * Analyzing Data", 2nd ed., ch. 12 and 14; O'Brien & Kaiser 1985, Psychol. Bull. 97:316–333).
 * For an effect with between part B and within part W: the scores Z = Y·C_W (C_W the Kronecker
 * product of orthonormal Helmert contrasts for W's factors and averaging vectors 1/√l for the
 * others, p columns) are regressed on the sum-to-zero coded full factorial of the between factors
 * (g groups); SS_effect = tr((L·B̂)ᵀ[L(XᵀX)⁻¹Lᵀ]⁻¹(L·B̂)) for L selecting B's columns (the intercept
 * when B is empty), SS_error = tr of the residual SSP matrix (subjects within groups, ν = N − g);
 * df1 = q·p, df2 = ν·p, F = (SS/df1)/(SS_error/df2). Between effects are tested against the
 * subjects-within-groups error, within effects and their interactions with between factors against
 * their own effect × subjects-within-groups error. Sphericity (Mauchly, GG, HF) from the pooled
 * within-group error matrix (see sphericity). Partial η² = SS/(SS + SS_error); generalised η²
 * = SS/(SS + Σ of the distinct error SS, the subjects-within-groups one included), all factors
 * manipulated (Olejnik & Algina 2003, Psychol. Methods 8:434–447; afex's ges).
 *
 * Cost: O(2^f · (N·c·p + g³)) for f factors, N participants, c within cells.
 * @throws Error when a within factor has fewer than 2 levels, a row has the wrong number of cells,
 *   a value is not finite, a group index is out of range, a group has no participant, or N ≤ g.
 * @example mixedAnova({ values: [[1, 2], [2, 4], [3, 5]], within: [{ name: "condition", levels: 2 }] })[0] // {effect: "condition", df1: 1, df2: 2, F: 28, p: 0.0339…, …}
 */
export function mixedAnova(input: MixedAnovaInput): AnovaEffect[] {
  const { values, within } = input;
  const between = input.between ?? [];
  const n = values.length;
  for (const f of [...within, ...between]) {
    if (!Number.isInteger(f.levels) || f.levels < 2) throw new Error(`mixedAnova requires at least 2 levels of factor ${f.name}`);
  }
  const cells = within.reduce((c, f) => c * f.levels, 1);
  const g = between.reduce((c, f) => c * f.levels, 1);
  const groups = input.groups ?? values.map(() => 0);
  if (groups.length !== n) throw new Error("mixedAnova requires one group per participant");
  for (const row of values) {
    if (row.length !== cells) throw new Error(`mixedAnova requires ${cells} cells per participant, got ${row.length}`);
    if (row.some((v) => !Number.isFinite(v))) throw new Error("mixedAnova requires finite values");
  }
  const counts = new Array<number>(g).fill(0);
  for (const gi of groups) {
    if (!Number.isInteger(gi) || gi < 0 || gi >= g) throw new Error(`mixedAnova: group index ${gi} is out of range`);
    counts[gi]!++;
  }
  if (counts.some((c) => c === 0)) throw new Error("mixedAnova requires at least one participant in every combination of between levels");
  const errorDf = n - g;
  if (errorDf < 1) throw new Error(`mixedAnova requires more participants (${n}) than groups (${g})`);

  const codes = between.map((f) => sumToZeroCoding(f.levels));
  const x = new Matrix(groups.map((gi) => designRow(between, codes, gi)));
  const xtxInv = inverse(x.transpose().mmul(x));
  const hat = xtxInv.mmul(x.transpose());
  const terms = columnTerms(between);
  const y = new Matrix(values.map((r) => [...r]));

  const withinParts = new Map<number, WithinPart>();
  const withinPart = (mask: number): WithinPart => {
    const known = withinParts.get(mask);
    if (known) return known;
    const members = within.map((_, i) => i).filter((i) => mask & (1 << i));
    const z = y.mmul(new Matrix(withinContrasts(within, members)));
    const coefficients = hat.mmul(z);
    const residual = z.clone().sub(x.mmul(coefficients));
    const part = { coefficients, sspe: residual.transpose().mmul(residual), p: z.columns };
    withinParts.set(mask, part);
    return part;
  };

  const names = [...between.map((f) => f.name), ...within.map((f) => f.name)];
  const order = input.order ?? names;
  const rank = names.map((name, i) => {
    const at = order.indexOf(name);
    return at === -1 ? order.length + i : at;
  });
  const rows: Omit<AnovaEffect, "generalizedEta2">[] = [];
  const errorSs = new Map<number, number>();
  errorSs.set(0, trace(withinPart(0).sspe));
  for (const subset of effectSubsets(names.length, rank)) {
    let betweenMask = 0;
    let withinMask = 0;
    for (const i of subset) {
      if (i < between.length) betweenMask |= 1 << i;
      else withinMask |= 1 << (i - between.length);
    }
    const part = withinPart(withinMask);
    const columns = terms.map((t, j) => (t === betweenMask ? j : -1)).filter((j) => j >= 0);
    const estimate = part.coefficients.selection(columns, [...Array(part.p).keys()]);
    const middle = inverse(xtxInv.selection(columns, columns));
    const ssEffect = trace(estimate.transpose().mmul(middle).mmul(estimate));
    const ssError = trace(part.sspe);
    errorSs.set(withinMask, ssError);
    const df1 = columns.length * part.p;
    const df2 = errorDf * part.p;
    const kind = withinMask === 0 ? "between" : betweenMask === 0 ? "within" : "mixed";
    const notes: string[] = [];
    let F: number | null = null;
    if (ssError > 0) F = ssEffect / df1 / (ssError / df2);
    else notes.push("no error variance (every participant's scores agree exactly): F cannot be computed");
    const p = F === null ? null : fUpperTail(F, df1, df2);
    const row: Omit<AnovaEffect, "generalizedEta2"> = {
      effect: subset.map((i) => names[i]!).join(":"),
      df1,
      df2,
      F,
      p,
      epsilonGG: null,
      pGG: null,
      partialEta2: ssEffect + ssError > 0 ? ssEffect / (ssEffect + ssError) : null,
      epsilonHF: null,
      pHF: null,
      pLowerBound: null,
      ssEffect,
      ssError,
      mauchly: null,
      kind,
      note: null,
    };
    if (kind !== "between") {
      row.pLowerBound = F === null ? null : fUpperTail(F, df1 / part.p, df2 / part.p);
      if (part.p === 1) {
        row.epsilonGG = 1;
        row.epsilonHF = 1;
        row.pGG = p;
        row.pHF = p;
      } else {
        const s = sphericity(part.sspe.to2DArray(), errorDf, cells);
        if (s.computable) {
          row.epsilonGG = s.epsilonGG;
          row.epsilonHF = s.epsilonHF;
          row.mauchly = s.mauchly;
          row.pGG = F === null ? null : fUpperTail(F, df1 * s.epsilonGG, df2 * s.epsilonGG);
          const hf = Math.min(1, s.epsilonHF);
          row.pHF = F === null ? null : fUpperTail(F, df1 * hf, df2 * hf);
        } else {
          notes.push(`${s.reason}; p (lower bound) uses ε = 1/${part.p}`);
        }
      }
    }
    row.note = notes.length ? notes.join("; ") : null;
    rows.push(row);
  }
  const errorTotal = [...errorSs.values()].reduce((s, v) => s + v, 0);
  return rows.map((r) => ({ ...r, generalizedEta2: r.ssEffect + errorTotal > 0 ? r.ssEffect / (r.ssEffect + errorTotal) : null }));
}

function trace(m: Matrix): number {
  let t = 0;
  for (let i = 0; i < Math.min(m.rows, m.columns); i++) t += m.get(i, i);
  return t;
}
