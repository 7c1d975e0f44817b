import { defaultTransferConfig, type TransferConfig } from "@/lib/motion/config";
import { configFieldCatalogue, configFieldKeys } from "./configFields";

type Partial = Record<string, unknown>;
type DesignLike = { baseConfig?: Partial; factors?: { levels?: { config?: Partial }[] }[]; task?: { displayMode?: "cursor" | "view" } };

/**
 * A configuration merged without validation (mergedConfigUnchecked): defaults, then each part in
 * turn, with the task's display mode (the runner draws in the task's mode, whatever a level says).
 * For deciding which fields to show only; validation is configFieldIssues'. Cost: O(fields).
 * @throws never.
 * @example mergedConfigUnchecked([{ technique: "stick" }], "view").stickMode // "rate"
 */
export function mergedConfigUnchecked(parts: readonly (Partial | undefined)[], displayMode: "cursor" | "view" | undefined): TransferConfig {
  const out = Object.assign({}, defaultTransferConfig, ...parts.map((p) => p ?? {})) as TransferConfig;
  if (displayMode) out.displayMode = displayMode;
  return out;
}

/**
 * The configurations a level takes part in (levelContexts): the base, then the level, with every
 * combination of the other factors' levels (as the crossing of conditions merges them:
 * base, then factor 1's level, factor 2's, ...). Without other factors: just base + level.
 * Cost: O(product of the other factors' level counts).
 * @throws never.
 * @example levelContexts(design, 1, 0).map((c) => c.technique) // ["motion", "stick"] when factor 0 sets the technique
 */
export function levelContexts(design: DesignLike, factorIndex: number, levelIndex: number): TransferConfig[] {
  const factors = design.factors ?? [];
  let combos: Partial[][] = [[]];
  factors.forEach((f, fi) => {
    const levels = f.levels ?? [];
    const choices = fi === factorIndex ? [levels[levelIndex]?.config ?? {}] : levels.length ? levels.map((l) => l.config ?? {}) : [{}];
    combos = combos.flatMap((c) => choices.map((x) => [...c, x]));
  });
  return combos.map((parts) => mergedConfigUnchecked([design.baseConfig, ...parts], design.task?.displayMode));
}

/**
 * The fields that change something in at least one of the given configurations (relevantFields),
 * by the catalogue's relevance rules. Cost: O(configurations × fields).
 * @throws never.
 * @example relevantFields([mergedConfigUnchecked([{ technique: "mouse" }], "cursor")]).has("gain") // false
 */
export function relevantFields(configs: readonly TransferConfig[]): Set<string> {
  const out = new Set<string>();
  for (const key of configFieldKeys) {
    const entry = configFieldCatalogue[key];
    if (configs.some((c) => entry.relevant(c))) out.add(key);
  }
  return out;
}

/** The fields that matter for the base and for each level, comma-separated in catalogue order (relevantFieldsPerLevel). */
export interface LevelRelevance {
  /** For the base: every condition's fields (only the base merged when the first factor has no levels). */
  base: string;
  /** levels[factor][level]: the fields of the conditions that level takes part in. */
  levels: string[][];
}

/**
 * What relevantFields(levelContexts(design, f, l)) gives for every level at once, and the base's
 * fields (relevantFieldsPerLevel): each crossed condition is merged and judged once, and each level
 * takes the union over the conditions it is in, instead of merging every condition again for each
 * of its levels. Cost: O(conditions × fields) instead of O(levels × conditions × fields).
 * @throws never.
 * @example relevantFieldsPerLevel({}, [[{ technique: "mouse" }, { technique: "motion" }]], "cursor").levels[0][0].includes("gain") // false
 */
export function relevantFieldsPerLevel(base: Partial | undefined, levelConfigs: readonly (readonly (Partial | undefined)[])[], displayMode: "cursor" | "view" | undefined): LevelRelevance {
  const keys = configFieldKeys;
  const judge = (parts: readonly (Partial | undefined)[]): boolean[] => {
    const merged = mergedConfigUnchecked([base, ...parts], displayMode);
    return keys.map((k) => configFieldCatalogue[k].relevant(merged));
  };
  const union = (into: boolean[], from: readonly boolean[]): void => { from.forEach((v, i) => { if (v) into[i] = true; }); };
  const join = (flags: readonly boolean[]): string => keys.filter((_, i) => flags[i]).join(",");

  const perLevel = levelConfigs.map((levels) => levels.map(() => keys.map(() => false)));
  const all = keys.map(() => false);
  // every combination of one level per factor (a factor without levels adds nothing: index -1)
  let combos: { parts: (Partial | undefined)[]; picks: number[] }[] = [{ parts: [], picks: [] }];
  for (const levels of levelConfigs) {
    const choices = levels.length ? levels.map((c, li) => ({ c: c ?? {}, li })) : [{ c: {}, li: -1 }];
    combos = combos.flatMap((x) => choices.map(({ c, li }) => ({ parts: [...x.parts, c], picks: [...x.picks, li] })));
  }
  for (const { parts, picks } of combos) {
    const flags = judge(parts);
    union(all, flags);
    picks.forEach((li, fi) => { if (li >= 0) union(perLevel[fi]![li]!, flags); });
  }
  const firstHasLevels = (levelConfigs[0]?.length ?? 0) > 0;
  return {
    base: levelConfigs.length === 0 || firstHasLevels ? join(all) : join(judge([])),
    levels: perLevel.map((levels) => levels.map(join)),
  };
}

/** One field a level changes from the study-wide base settings. */
export interface SettingChange {
  field: string;
  label: string;
  unit: string;
  from: unknown;
  to: unknown;
}

/**
 * What a level changes from the base settings (changesFromBase): each field the level sets to a
 * value other than the base's effective value (the base's own, else the default). Cost: O(fields).
 * @throws never.
 * @example changesFromBase({ gain: 2 }, { gain: 6 }) // [{ field: "gain", label: "CD gain", from: 2, to: 6, … }]
 */
export function changesFromBase(base: Partial | undefined, level: Partial | undefined): SettingChange[] {
  const out: SettingChange[] = [];
  const effective = { ...defaultTransferConfig, ...(base ?? {}) } as Record<string, unknown>;
  for (const [field, to] of Object.entries(level ?? {})) {
    if (to === undefined) continue;
    const from = effective[field];
    if (Object.is(from, to)) continue;
    const entry = (configFieldCatalogue as Record<string, { label: string; unit: string } | undefined>)[field];
    out.push({ field, label: entry?.label ?? field, unit: entry?.unit ?? "", from, to });
  }
  return out;
}

/** A value as the editor prints it ("none" for an unset button, "on"/"off" for a switch). */
export function formatSetting(value: unknown): string {
  if (value === null) return "none";
  if (value === true) return "on";
  if (value === false) return "off";
  if (typeof value === "number") return String(Math.round(value * 1e6) / 1e6);
  return String(value);
}
