import type { TableSpec } from "./tableSpecs";

const cell = (s: string): string => s.replace(/\|/g, "\\|").replace(/\r?\n/g, " ");

/**
 * The archive's codebook.md (buildCodebook): every table and column with its type, unit and
 * meaning, from the same specifications as datapackage.json, plus notes on anonymisation.
 * Cost: O(fields).
 * @throws never.
 * @example buildCodebook("Gyro study", [], []).startsWith("# Codebook: Gyro study") // true
 */
export function buildCodebook(title: string, tables: readonly TableSpec[], notes: readonly string[], extraSections: readonly string[] = []): string {
  const parts = [`# Codebook: ${title}`, "", "Empty fields mean \"not available\". Every CSV is UTF-8, comma-separated, with a header row and \"\\n\" line ends.", ""];
  for (const t of tables) {
    parts.push(`## ${t.path}: ${t.title}`, "", t.description, "", "| column | type | unit | meaning |", "| --- | --- | --- | --- |");
    for (const f of t.fields) parts.push(`| ${cell(f.name)} | ${f.type} | ${f.unit ?? ""} | ${cell(f.description)} |`);
    parts.push("");
  }
  parts.push(...extraSections);
  if (notes.length > 0) {
    parts.push("## Anonymisation", "");
    for (const n of notes) parts.push(`- ${n}`);
    parts.push("");
  }
  return parts.join("\n");
}
