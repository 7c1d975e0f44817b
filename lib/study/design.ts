import { z } from "zod";
import { transferConfigSchema, type TransferConfig } from "@/lib/motion/config";
import { conditionLimit } from "./counterbalance/conditionLimit";
import { configFieldIssues, levelFieldIssues } from "./editor/configIssues";

/**
 * The study design as the designer stores it (studies.design) and as the participant runner and
 * the analysis read it. One schema, shared by the forms (zodResolver) and the server.
 */

const name = z.string().trim().regex(/^[a-z][a-z0-9_]{0,31}$/, "use lower-case letters, digits and _ (it becomes the f_NAME column)");
const label = z.string().trim().min(1, "must not be empty").max(60);

/** A level sets transfer-function parameters (any subset of the configuration's fields). */
export const levelSchema = z.strictObject({
  label,
  config: z.record(z.string(), z.unknown()).default({}),
});

export const factorSchema = z.strictObject({
  name,
  levels: z.array(levelSchema).min(1, "a factor needs at least one level").max(8),
});

export const betweenFactorSchema = z.strictObject({ name, levels: z.array(label).min(2).max(8) });

export const taskSchema = z.strictObject({
  type: z.enum(["ring", "strip"]).default("ring"),
  displayMode: z.enum(["cursor", "view"]).default("cursor"),
  /** px, mm, visual degrees (cursor mode after calibration) or view degrees (view mode) */
  unit: z.enum(["px", "mm", "deg-visual", "deg-view"]).default("px"),
  amplitudes: z.array(z.number().finite().positive()).min(1).max(8),
  widths: z.array(z.number().finite().positive()).min(1).max(8),
  targetsPerRing: z.number().int().min(5).max(51).default(13),
  sequencesPerAW: z.number().int().min(1).max(10).default(1),
  practiceSequences: z.number().int().min(0).max(10).default(1),
  selection: z.enum(["button", "tap", "click", "dwell"]).default("tap"),
  dwellMs: z.number().int().min(100).max(3000).default(600),
  trialTimeLimitMs: z.number().int().min(1000).max(60_000).default(10_000),
});

export const likertItemSchema = z.strictObject({
  id: name,
  text: z.string().trim().min(3).max(300),
  points: z.union([z.literal(5), z.literal(7)]).default(7),
  lowLabel: z.string().trim().min(1).max(40),
  highLabel: z.string().trim().min(1).max(40),
});

export const studyDesignSchema = z
  .strictObject({
    baseConfig: z.record(z.string(), z.unknown()).default({}),
    factors: z.array(factorSchema).min(1, "add at least one within-subject factor").max(4),
    /** null: the full crossing; else the labels of the chosen conditions */
    conditionSubset: z.array(z.string()).nullable().default(null),
    betweenFactors: z.array(betweenFactorSchema).max(2).default([]),
    task: taskSchema,
    blocks: z.number().int().min(1).max(20).default(1),
    minBreakSeconds: z.number().int().min(0).max(1800).default(30),
    perConditionItems: z.array(likertItemSchema).max(12).default([]),
    finalQuestionnaire: z
      .strictObject({ ageBand: z.boolean().default(true), handedness: z.boolean().default(true), experience: z.boolean().default(true), comments: z.boolean().default(false) })
      .default({ ageBand: true, handedness: true, experience: true, comments: false }),
    counterbalancing: z.strictObject({ method: z.enum(["williams", "cyclic", "all-orders", "random"]).default("williams"), seed: z.number().int().min(0).max(2 ** 31 - 1).default(1) }),
    plannedParticipants: z.number().int().min(1).max(10_000).default(12),
    requireTypedName: z.boolean().default(false),
    eraseOnWithdrawal: z.boolean().default(true),
    compensation: z.string().trim().max(300).default(""),
    /** the lowest motion sample rate the study accepts (Hz); the device check refuses slower sensors */
    minSampleRateHz: z.number().min(10).max(1000).default(50),
  })
  .superRefine((d, ctx) => {
    if (d.task.targetsPerRing % 2 === 0) ctx.addIssue({ code: "custom", path: ["task", "targetsPerRing"], message: "must be odd, so every hop crosses the ring" });
    d.task.widths.forEach((w, wi) => {
      if (d.task.amplitudes.some((a) => w >= a)) ctx.addIssue({ code: "custom", path: ["task", "widths", wi], message: "every width must be smaller than every amplitude (W < A)" });
    });
    if (new Set(d.task.amplitudes).size !== d.task.amplitudes.length) ctx.addIssue({ code: "custom", path: ["task", "amplitudes"], message: "amplitudes must differ" });
    if (new Set(d.task.widths).size !== d.task.widths.length) ctx.addIssue({ code: "custom", path: ["task", "widths"], message: "widths must differ" });
    const names = d.factors.map((f) => f.name).concat(d.betweenFactors.map((f) => f.name));
    names.forEach((n, i) => {
      if (names.indexOf(n) !== i) ctx.addIssue({ code: "custom", path: ["factors", i, "name"], message: `duplicate factor name "${n}"` });
    });
    d.factors.forEach((f, fi) => {
      const labels = f.levels.map((l) => l.label.toLowerCase());
      labels.forEach((l, li) => {
        if (labels.indexOf(l) !== li) ctx.addIssue({ code: "custom", path: ["factors", fi, "levels", li, "label"], message: `duplicate level "${f.levels[li]!.label}"` });
      });
    });
    const all = crossConditions(d.factors);
    if (d.conditionSubset !== null) {
      if (d.conditionSubset.length === 0) ctx.addIssue({ code: "custom", path: ["conditionSubset"], message: "choose at least one condition" });
      for (const c of d.conditionSubset) if (!all.some((x) => x.label === c)) ctx.addIssue({ code: "custom", path: ["conditionSubset"], message: `unknown condition "${c}"` });
    }
    // The conditions every participant runs; the counterbalancing must be able to order them.
    const chosen = d.conditionSubset === null ? null : new Set(d.conditionSubset);
    const run = chosen === null ? all : all.filter((c) => chosen.has(c.label));
    const runs = run.length;
    const limit = conditionLimit(d.counterbalancing.method);
    if (runs > limit) {
      ctx.addIssue({
        code: "custom", path: ["counterbalancing", "method"],
        message: `${runs} conditions are more than this method orders (at most ${limit}${limit < 64 ? "; the Latin squares take up to 64" : ""}): choose the conditions to run under Conditions, or use fewer levels`,
      });
    }
    // The base settings, and each level over the base, must be valid: the problem is reported at
    // the field (baseConfig.gain, factors.1.levels.0.config.gain) so the form shows it there.
    const baseIssues = configFieldIssues(d.baseConfig);
    for (const i of baseIssues) ctx.addIssue({ code: "custom", path: i.field ? ["baseConfig", i.field] : ["baseConfig"], message: i.message });
    let levelProblems = baseIssues.length > 0;
    d.factors.forEach((f, fi) => f.levels.forEach((l, li) => {
      for (const i of levelFieldIssues(d.baseConfig, l.config)) {
        levelProblems = true;
        ctx.addIssue({ code: "custom", path: i.field ? ["factors", fi, "levels", li, "config", i.field] : ["factors", fi, "levels", li, "config"], message: i.message });
      }
    }));
    if (levelProblems || runs > limit) return;
    // Every condition run must have a valid merged configuration (levels of different factors can
    // conflict, e.g. a slow speed in one and a fast speed in another); a combination left out of
    // the chosen conditions is never run, so it may conflict (and checking only those run keeps
    // the form quick on a large crossing: 16 checks instead of 256 for 16 of 4 × 4 × 4 × 4).
    for (const c of run) {
      const r = transferConfigSchema.safeParse(mergeConfig(d.baseConfig, c.levels.map((l) => l.config)));
      if (!r.success) {
        const i = r.error.issues[0]!;
        ctx.addIssue({ code: "custom", path: ["factors"], message: `condition "${c.label}": ${i.path.join(".") || "configuration"}: ${i.message}` });
      }
    }
  });

export type StudyDesign = z.output<typeof studyDesignSchema>;
export type StudyDesignInput = z.input<typeof studyDesignSchema>;
export type Factor = z.output<typeof factorSchema>;
export type Level = z.output<typeof levelSchema>;

/** One condition: a level of every within factor. */
export type Condition = { label: string; index: number; levels: Level[]; factorLevels: Record<string, string> };

/** Separates level labels in a condition label ("motion / gain 6"). */
export const CONDITION_SEPARATOR = " / ";

function mergeConfig(base: Record<string, unknown>, parts: Record<string, unknown>[]): Record<string, unknown> {
  return Object.assign({}, base, ...parts) as Record<string, unknown>;
}

function crossConditions(factors: Factor[]): Condition[] {
  let combos: Level[][] = [[]];
  for (const f of factors) combos = combos.flatMap((c) => f.levels.map((l) => [...c, l]));
  return combos.map((levels, index) => ({
    label: levels.map((l) => l.label).join(CONDITION_SEPARATOR),
    index,
    levels,
    factorLevels: Object.fromEntries(factors.map((f, i) => [f.name, levels[i]!.label])),
  }));
}

/** The study's conditions: the full crossing of the within factors, or the chosen subset, in crossing order. */
export function conditionsOf(design: StudyDesign): Condition[] {
  const all = crossConditions(design.factors);
  const chosen = design.conditionSubset === null ? all : all.filter((c) => design.conditionSubset!.includes(c.label));
  return chosen.map((c, index) => ({ ...c, index }));
}

/** The full transfer configuration of one condition: base, then each factor's level, defaults filled. */
export function conditionConfig(design: StudyDesign, condition: Condition): TransferConfig {
  return transferConfigSchema.parse(mergeConfig(design.baseConfig, condition.levels.map((l) => l.config)));
}
