import { describe, expect, it } from "vitest";
import { z } from "zod";
import { transferConfigSchema } from "@/lib/motion/config";
import { presetNames, presets } from "@/lib/motion/presets";
import { studyDesignSchema, taskSchema } from "@/lib/study/design";
import { configFieldCatalogue, configFieldKeys, configGroups } from "./configFields";
import { configFieldIssues } from "./configIssues";
import { designFieldLabels } from "./designFields";
import { changesFromBase, levelContexts, mergedConfigUnchecked, relevantFields, relevantFieldsPerLevel } from "./levelSettings";
import { presetNotes } from "./presetNotes";
import { fieldSpecOf, rangeText } from "./schemaFields";

const schemaKeys = Object.keys(transferConfigSchema.shape);

describe("the settings editor covers the configuration schema", () => {
  it("every schema field has an editor entry, and every entry is a schema field", () => {
    // A new field in lib/motion/config.ts without an entry in configFields.ts fails here.
    expect([...configFieldKeys].sort()).toEqual([...schemaKeys].sort());
  });
  it("every schema field is of a kind the editor can render, with its default", () => {
    for (const key of schemaKeys) {
      const spec = fieldSpecOf(key, transferConfigSchema.shape[key as keyof typeof transferConfigSchema.shape]);
      const parsedDefault = (transferConfigSchema.parse({}) as Record<string, unknown>)[key];
      expect(spec.defaultValue, key).toEqual(parsedDefault);
    }
  });
  it("every entry sits in a known group and every enum value has a plain label", () => {
    const groups = new Set<string>(configGroups.map((g) => g.id));
    for (const key of schemaKeys) {
      const entry = configFieldCatalogue[key as keyof typeof configFieldCatalogue];
      expect(groups.has(entry.group), key).toBe(true);
      const spec = fieldSpecOf(key, transferConfigSchema.shape[key as keyof typeof transferConfigSchema.shape]);
      if (spec.kind === "enum" && key !== "displayMode") for (const o of spec.options) expect(entry.choices?.[o], `${key}=${o}`).toBeTruthy();
    }
  });
  it("a field kind the editor cannot show is refused, so it fails the coverage test rather than rendering wrong", () => {
    expect(() => fieldSpecOf("x", z.array(z.number()).default([]))).toThrow(/cannot show/);
    expect(() => fieldSpecOf("y", z.number())).toThrow(/has no default/);
  });
  it("ranges are read from the schema: gain 0 < x ≤ 50, a button 0–31 or none", () => {
    expect(rangeText(fieldSpecOf("gain", transferConfigSchema.shape.gain))).toBe("0 < x ≤ 50");
    expect(rangeText(fieldSpecOf("clutchButton", transferConfigSchema.shape.clutchButton))).toBe("button 0–31, or none");
  });
  it("every preset has a note, and every note a preset", () => {
    expect(Object.keys(presetNotes).sort()).toEqual([...presetNames].sort());
    for (const n of presetNames) expect(presetNotes[n].when.length).toBeGreaterThan(40);
    expect(Object.keys(presets).length).toBe(presetNames.length);
  });
  it("every design field, and every task field, has a place (label) in the design form", () => {
    const designKeys = Object.keys(studyDesignSchema.shape).sort();
    expect(Object.keys(designFieldLabels).sort()).toEqual(designKeys);
    expect(Object.keys(designFieldLabels.task).sort()).toEqual(Object.keys(taskSchema.shape).sort());
  });
});

describe("field errors in the researcher's words", () => {
  it("gain 0 is refused at the gain field (the schema's gain is positive)", () => {
    expect(configFieldIssues({ gain: 0 })).toEqual([{ field: "gain", message: "must be greater than 0" }]);
  });
  it("a fast speed below the slow speed is refused at the fast speed, naming the slow speed", () => {
    expect(configFieldIssues({ gainCurve: "two-level", curveSlowSpeedDegPerS: 20, curveFastSpeedDegPerS: 10 })).toEqual([
      { field: "curveFastSpeedDegPerS", message: "must be greater than the slow speed" },
    ]);
  });
  it("a typed word where a number belongs, and an unknown key, are each refused at their field", () => {
    expect(configFieldIssues({ gain: "six", colour: 1 })).toEqual(expect.arrayContaining([{ field: "gain", message: "enter a number" }, { field: "colour", message: "not a configuration field" }]));
  });
});

describe("which fields a level shows", () => {
  it("a mouse level shows no gyroscope gain, a motion level shows it", () => {
    expect(relevantFields([mergedConfigUnchecked([{ technique: "mouse" }], "cursor")]).has("gain")).toBe(false);
    expect(relevantFields([mergedConfigUnchecked([{ technique: "motion" }], "view")]).has("gain")).toBe(true);
  });
  it("two-level curve fields appear only with the two-level curve", () => {
    const f = relevantFields([mergedConfigUnchecked([{ gainCurve: "two-level" }], "view")]);
    expect(f.has("curveFastSpeedDegPerS")).toBe(true);
    expect(f.has("curveExponent")).toBe(false);
  });
  it("a gain level crossed with a technique factor shows the fields of every technique it meets", () => {
    const design = {
      factors: [
        { levels: [{ config: { technique: "motion" } }, { config: { technique: "stick" } }] },
        { levels: [{ config: { gain: 2 } }, { config: { gain: 6 } }] },
      ],
      task: { displayMode: "view" as const },
    };
    const ctx = levelContexts(design, 1, 0);
    expect(ctx.map((c) => c.technique)).toEqual(["motion", "stick"]);
    const f = relevantFields(ctx);
    expect(f.has("gain") && f.has("stickMaxRateDegPerS")).toBe(true);
  });
  it("all levels at once (the form's fast path) show what each level's own crossing shows", () => {
    // Not an outside check: the one-pass union must equal relevantFields(levelContexts(...)) per
    // level, the rule the test above ties to the techniques, for a crossing where it matters.
    const design = {
      baseConfig: { gain: 3 },
      factors: [
        { levels: [{ config: { technique: "motion" } }, { config: { technique: "stick" } }, { config: { technique: "mouse" } }] },
        { levels: [{ config: { gainCurve: "two-level" } }, { config: {} }] },
        { levels: [] },
      ],
      task: { displayMode: "cursor" as const },
    };
    const configs = design.factors.map((f) => f.levels.map((l) => l.config));
    const fast = relevantFieldsPerLevel(design.baseConfig, configs, "cursor");
    design.factors.forEach((f, fi) => f.levels.forEach((_, li) => expect(fast.levels[fi]![li]).toBe([...relevantFields(levelContexts(design, fi, li))].join(","))));
    expect(fast.levels[0]![2]).not.toBe(fast.levels[0]![1]); // mouse and stick differ, so the check can fail
    const every = design.factors[0]!.levels.flatMap((_, li) => levelContexts(design, 0, li));
    expect(fast.base).toBe([...relevantFields(every)].join(","));
    expect(relevantFieldsPerLevel({}, [], "view").base).toBe([...relevantFields([mergedConfigUnchecked([{}], "view")])].join(","));
  });
  it("a level lists what it changes from the base", () => {
    expect(changesFromBase({ gain: 2 }, { gain: 6, technique: "motion" }).map((c) => [c.field, c.from, c.to])).toEqual([["gain", 2, 6]]);
  });
});
