import type { z } from "zod";
import { transferConfigSchema } from "@/lib/motion/config";
import { configFieldCatalogue, configFieldKeys } from "./configFields";

/** One problem with a configuration, at the field the researcher must change. */
export interface ConfigFieldIssue {
  /** The configuration field, or "" when the problem is not one field's. */
  field: string;
  message: string;
}

const labelOf = (key: string): string | undefined => (configFieldCatalogue as Record<string, { label: string } | undefined>)[key]?.label;

/** A custom rule's message with field keys replaced by their labels ("must be greater than the slow speed"). */
function withLabels(message: string): string {
  let out = message;
  for (const key of configFieldKeys) {
    const label = labelOf(key);
    if (label && out.includes(key)) out = out.replaceAll(key, `the ${label.charAt(0).toLowerCase()}${label.slice(1)}`);
  }
  return out;
}

/**
 * A zod issue of the transfer configuration in the researcher's words (configIssueText).
 *
 * Purpose: the editor shows errors at the field, in plain sentences ("must be greater than 0",
 * "must be greater than the slow speed") rather than the validator's wording. Cost: O(fields).
 * @throws never.
 * @example configIssueText({ code: "too_small", minimum: 0, inclusive: false, … }) // "must be greater than 0"
 */
export function configIssueText(issue: z.core.$ZodIssue): string {
  switch (issue.code) {
    case "too_small":
      return `must be ${issue.inclusive ? "at least" : "greater than"} ${String(issue.minimum)}`;
    case "too_big":
      return `must be ${issue.inclusive ? "at most" : "less than"} ${String(issue.maximum)}`;
    case "invalid_type":
      return issue.expected === "number" ? "enter a number" : `must be a ${issue.expected}`;
    case "invalid_value":
      return `choose one of ${issue.values.map(String).join(", ")}`;
    case "unrecognized_keys":
      return "not a configuration field";
    default:
      return withLabels(issue.message);
  }
}

/**
 * Problems of a (partial) transfer configuration, one per field (configFieldIssues).
 *
 * Purpose: validate what a level or the base sets, merged as a condition would merge it, and
 * say at which field each problem lies, so the design form can show it there. The first problem
 * of each field is kept. Source: the configuration's own schema (lib/motion/config.ts).
 * Cost: one schema parse.
 * @throws never.
 * @example configFieldIssues({ gain: 0 }) // [{ field: "gain", message: "must be greater than 0" }]
 */
export function configFieldIssues(config: Record<string, unknown>): ConfigFieldIssue[] {
  const r = transferConfigSchema.safeParse(config);
  if (r.success) return [];
  const out: ConfigFieldIssue[] = [];
  const seen = new Set<string>();
  for (const issue of r.error.issues) {
    const fields = issue.code === "unrecognized_keys" ? issue.keys : [issue.path.length > 0 ? String(issue.path[0]) : ""];
    for (const field of fields) {
      if (seen.has(field)) continue;
      seen.add(field);
      out.push({ field, message: configIssueText(issue) });
    }
  }
  return out;
}

/**
 * Problems of a level over the base settings (levelFieldIssues): the level merged over the base,
 * leaving out a field's problem that the base alone already has and the level does not touch
 * (that one is shown at the base). Cost: two schema parses.
 * @throws never.
 * @example levelFieldIssues({ gain: 0 }, { technique: "stick" }) // [] (the base shows the gain error)
 */
export function levelFieldIssues(base: Record<string, unknown>, level: Record<string, unknown>): ConfigFieldIssue[] {
  const baseFields = new Set(configFieldIssues(base).map((i) => i.field));
  return configFieldIssues({ ...base, ...level }).filter((i) => !(baseFields.has(i.field) && !(i.field in level)));
}
