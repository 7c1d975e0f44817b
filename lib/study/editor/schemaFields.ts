import type { z } from "zod";

/** How the editor renders one field, read from the field's zod schema (never typed by hand). */
export type FieldSpec =
  | { kind: "number"; min: number | null; minInclusive: boolean; max: number | null; maxInclusive: boolean; integer: boolean; defaultValue: number }
  | { kind: "enum"; options: readonly string[]; defaultValue: string }
  | { kind: "boolean"; defaultValue: boolean }
  | { kind: "button"; min: number; max: number; defaultValue: number | null };

type Def = { type: string; innerType?: ZodLike; defaultValue?: unknown; checks?: { _zod: { def: { check: string; value?: number; inclusive?: boolean; format?: string } } }[]; entries?: Record<string, string> };
type ZodLike = { def: Def; options?: readonly string[]; isInt?: boolean };

function numberBounds(schema: ZodLike): { min: number | null; minInclusive: boolean; max: number | null; maxInclusive: boolean; integer: boolean } {
  let min: number | null = null, max: number | null = null, minInclusive = true, maxInclusive = true;
  let integer = schema.isInt === true;
  for (const c of schema.def.checks ?? []) {
    const d = c._zod.def;
    if (d.check === "greater_than" && typeof d.value === "number") {
      min = d.value;
      minInclusive = d.inclusive === true;
    } else if (d.check === "less_than" && typeof d.value === "number") {
      max = d.value;
      maxInclusive = d.inclusive === true;
    } else if (d.check === "number_format" && (d.format === "safeint" || d.format === "int32")) {
      integer = true;
    }
  }
  return { min, minInclusive, max, maxInclusive, integer };
}

/**
 * The editor's view of one configuration field (fieldSpecOf).
 *
 * Purpose: the settings editor is generated from the configuration's zod schema, so range,
 * default and choices cannot drift from what the server accepts. Reads zod 4's public schema
 * definitions (`def`): a default wrapping a number, an enum, a boolean, or a nullable integer
 * (a controller button). Cost: O(checks).
 * @throws Error "fieldSpecOf: KEY has no default" / "… a kind the editor cannot show" for any
 *   other shape, so a new kind of field fails the editor's coverage test instead of rendering wrong.
 * @example fieldSpecOf("gain", transferConfigSchema.shape.gain) // { kind: "number", min: 0, minInclusive: false, max: 50, … defaultValue: 1 }
 */
export function fieldSpecOf(key: string, schema: z.ZodType): FieldSpec {
  const outer = schema as unknown as ZodLike;
  if (outer.def.type !== "default" || outer.def.innerType === undefined) throw new Error(`fieldSpecOf: ${key} has no default`);
  const inner = outer.def.innerType;
  const dv = outer.def.defaultValue;
  switch (inner.def.type) {
    case "number":
      if (typeof dv !== "number") break;
      return { kind: "number", ...numberBounds(inner), defaultValue: dv };
    case "enum":
      if (typeof dv !== "string") break;
      return { kind: "enum", options: inner.options ?? Object.values(inner.def.entries ?? {}), defaultValue: dv };
    case "boolean":
      if (typeof dv !== "boolean") break;
      return { kind: "boolean", defaultValue: dv };
    case "nullable": {
      const n = inner.def.innerType;
      if (n?.def.type !== "number" || (dv !== null && typeof dv !== "number")) break;
      const b = numberBounds(n);
      if (!b.integer || b.min === null || b.max === null) break;
      return { kind: "button", min: b.min, max: b.max, defaultValue: dv };
    }
  }
  throw new Error(`fieldSpecOf: ${key} is of a kind the editor cannot show (${inner.def.type})`);
}

/** "0 < x ≤ 50", "0 ≤ x ≤ 1000" or "1–4": the range as the editor prints it beside the field. */
export function rangeText(spec: FieldSpec): string {
  if (spec.kind === "button") return `button ${spec.min}–${spec.max}, or none`;
  if (spec.kind !== "number") return "";
  const lo = spec.min === null ? "" : `${spec.min} ${spec.minInclusive ? "≤" : "<"} `;
  const hi = spec.max === null ? "" : ` ${spec.maxInclusive ? "≤" : "<"} ${spec.max}`;
  return `${lo}x${hi}${spec.integer ? ", whole numbers" : ""}`;
}
