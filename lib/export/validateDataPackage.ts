import { z } from "zod";

/** Field types of Frictionless Table Schema v1 ("Types and formats"). */
export const TABLE_SCHEMA_TYPES = ["string", "number", "integer", "boolean", "object", "array", "date", "time", "datetime", "year", "yearmonth", "duration", "geopoint", "geojson", "any"] as const;

/** Data Package v1 "name": lower-case alphanumerics with ".", "_", "-" (and "/" in the pattern the profile gives). */
const packageName = z.string().regex(/^([-a-z0-9._/])+$/, "must be lower-case letters, digits, '.', '_', '-'");
const posixRelativePath = z.string().min(1).refine((p) => !p.startsWith("/") && !p.split("/").includes(".."), "must be a relative POSIX path without '..'");

const constraintsSchema = z.object({
  required: z.boolean().optional(),
  unique: z.boolean().optional(),
  minLength: z.number().int().nonnegative().optional(),
  maxLength: z.number().int().nonnegative().optional(),
  minimum: z.union([z.number(), z.string()]).optional(),
  maximum: z.union([z.number(), z.string()]).optional(),
  pattern: z.string().optional(),
  enum: z.array(z.unknown()).min(1).optional(),
}).loose();

const fieldSchema = z.object({
  name: z.string().min(1),
  type: z.enum(TABLE_SCHEMA_TYPES).optional(),
  format: z.string().optional(),
  title: z.string().optional(),
  description: z.string().optional(),
  constraints: constraintsSchema.optional(),
}).loose();

/** Table Schema v1: `fields` required, each with a `name`; primaryKey names existing fields. */
export const tableSchemaSchema = z.object({
  fields: z.array(fieldSchema).min(1),
  primaryKey: z.union([z.string(), z.array(z.string())]).optional(),
  missingValues: z.array(z.string()).optional(),
}).loose().superRefine((s, ctx) => {
  const names = s.fields.map((f) => f.name);
  names.forEach((n, i) => {
    if (names.indexOf(n) !== i) ctx.addIssue({ code: "custom", path: ["fields", i, "name"], message: `duplicate field name "${n}"` });
  });
  const keys = s.primaryKey === undefined ? [] : Array.isArray(s.primaryKey) ? s.primaryKey : [s.primaryKey];
  for (const k of keys) if (!names.includes(k)) ctx.addIssue({ code: "custom", path: ["primaryKey"], message: `primary key "${k}" is not a field` });
});

const resourceSchema = z.object({
  name: packageName,
  path: z.union([posixRelativePath, z.array(posixRelativePath).min(1)]).optional(),
  data: z.unknown().optional(),
  profile: z.string().optional(),
  title: z.string().optional(),
  description: z.string().optional(),
  format: z.string().optional(),
  mediatype: z.string().regex(/^(.+)\/(.+)$/).optional(),
  encoding: z.string().optional(),
  bytes: z.number().int().nonnegative().optional(),
  hash: z.string().optional(),
  dialect: z.object({ delimiter: z.string().length(1).optional(), header: z.boolean().optional(), lineTerminator: z.string().optional() }).loose().optional(),
  schema: tableSchemaSchema.optional(),
}).loose().superRefine((r, ctx) => {
  if (r.path === undefined && r.data === undefined) ctx.addIssue({ code: "custom", path: ["path"], message: "a resource needs path or data" });
  if (r.profile === "tabular-data-resource" && r.schema === undefined) ctx.addIssue({ code: "custom", path: ["schema"], message: "a tabular data resource needs a schema" });
});

/** Frictionless Data Package v1 descriptor, with Tabular Data Package and Table Schema v1 rules. */
export const dataPackageSchema = z.object({
  profile: z.string().optional(),
  name: packageName.optional(),
  id: z.string().optional(),
  title: z.string().optional(),
  description: z.string().optional(),
  version: z.string().optional(),
  created: z.iso.datetime({ offset: true }).optional(),
  licenses: z.array(z.object({ name: packageName.optional(), path: z.string().optional(), title: z.string().optional() }).loose().refine((l) => l.name !== undefined || l.path !== undefined, "a license needs name or path")).optional(),
  resources: z.array(resourceSchema).min(1, "a data package needs at least one resource"),
}).loose().superRefine((p, ctx) => {
  const names = p.resources.map((r) => r.name);
  names.forEach((n, i) => {
    if (names.indexOf(n) !== i) ctx.addIssue({ code: "custom", path: ["resources", i, "name"], message: `duplicate resource name "${n}"` });
  });
  if (p.profile === "tabular-data-package") {
    p.resources.forEach((r, i) => {
      if (r.profile !== "tabular-data-resource") ctx.addIssue({ code: "custom", path: ["resources", i, "profile"], message: "every resource of a tabular data package is a tabular data resource" });
    });
  }
});

/**
 * Validates a datapackage.json descriptor (validateDataPackage) against the Frictionless Data
 * Package v1 specification (required `resources`, each with `name` and `path` or `data`; name
 * pattern; relative POSIX paths), the Tabular Data Package / Tabular Data Resource profiles and
 * Table Schema v1 (fields with `name`, `type` from the specification's list, constraints,
 * primaryKey naming fields). Source: frictionlessdata.io specifications v1 (from memory of the
 * published JSON profiles; the required properties and the type list are as published).
 * Cost: O(fields).
 * @throws never: returns the issues ([] when valid).
 * @example validateDataPackage({ resources: [] }) // ["resources: a data package needs at least one resource"]
 */
export function validateDataPackage(descriptor: unknown): string[] {
  const r = dataPackageSchema.safeParse(descriptor);
  return r.success ? [] : r.error.issues.map((i) => `${i.path.join(".") || "descriptor"}: ${i.message}`);
}

/**
 * Checks one CSV value against a Table Schema v1 field type (valueMatchesFieldType), with the
 * default formats: integer, number (decimal, optional exponent, NaN/INF/-INF), boolean (default
 * true/false values), datetime (ISO 8601 / RFC 3339), string (anything). Empty = missing.
 * Cost: O(length).
 * @throws never.
 * @example valueMatchesFieldType("1.5", "integer") // false
 */
export function valueMatchesFieldType(value: string, type: string): boolean {
  if (value === "") return true;
  switch (type) {
    case "integer": return /^[-+]?\d+$/.test(value);
    case "number": return /^[-+]?(\d+(\.\d*)?|\.\d+)([eE][-+]?\d+)?$/.test(value) || ["NaN", "INF", "-INF"].includes(value);
    case "boolean": return ["true", "True", "TRUE", "1", "false", "False", "FALSE", "0"].includes(value);
    case "datetime": return z.iso.datetime({ offset: true }).safeParse(value).success;
    default: return true;
  }
}
