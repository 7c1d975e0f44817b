import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { defaultTransferConfig } from "./config";

// docs/configuration.md must list every configuration field with its real default.
describe("docs/configuration.md", () => {
  const doc = readFileSync(new URL("../../docs/configuration.md", import.meta.url), "utf8");
  it.each(Object.entries(defaultTransferConfig))("documents %s with its default", (field, value) => {
    const row = doc.split("\n").find((l) => l.startsWith(`| \`${field}\` |`));
    expect(row, `no table row for ${field}`).toBeDefined();
    expect(row!.split("|")[3]!.trim()).toBe(`\`${JSON.stringify(value)}\``);
  });
});
