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
