import { describe, expect, it } from "vitest";
import { defaultTransferConfig, parseTransferConfig, TransferConfigError, transferConfigSchema } from "./config";
import { presetConfig, presetNames } from "./presets";

describe("transfer configuration", () => {
  it("fills every default from an empty object", () => {
    expect(parseTransferConfig({})).toEqual(defaultTransferConfig);
    expect(defaultTransferConfig.gain).toBe(1);
    expect(defaultTransferConfig.frame).toBe("device");
  });
  it("names the field and the rule that failed", () => {
    expect(() => parseTransferConfig({ gain: 0 })).toThrow(TransferConfigError);
    try {
      parseTransferConfig({ gain: 0, frame: "sideways" });
    } catch (e) {
      const issues = (e as TransferConfigError).issues;
      expect(issues.some((i) => i.startsWith("gain: ") && /0/.test(i))).toBe(true);
      expect(issues.some((i) => i.startsWith("frame: "))).toBe(true);
    }
  });
  it("rejects unknown fields by name", () => {
    expect(() => parseTransferConfig({ gian: 3 })).toThrow("gian: not a configuration field");
  });
  it("checks rules between fields", () => {
    expect(() => parseTransferConfig({ stickDeadZone: 0.5, stickOuterEdge: 0.4 })).toThrow("stickOuterEdge: must be greater than stickDeadZone");
    expect(() => parseTransferConfig({ curveSlowSpeedDegPerS: 40, curveFastSpeedDegPerS: 30 })).toThrow("curveFastSpeedDegPerS");
    expect(() => parseTransferConfig({ activation: "while-aiming", aimButton: null })).toThrow("aimButton: must be set");
    expect(() => parseTransferConfig({ clutchButton: 4, recenterButton: 4 })).toThrow("recenterButton: must differ from clutchButton");
  });
  it("round-trips through JSON as the study designer stores it", () => {
    const c = parseTransferConfig({ gain: 6, gainCurve: "power", frame: "adaptive" });
    expect(parseTransferConfig(JSON.parse(JSON.stringify(c)))).toEqual(c);
  });
  it("every preset is a valid configuration; common-practice gains for the starting presets", () => {
    for (const name of presetNames) expect(transferConfigSchema.safeParse(presetConfig(name)).success).toBe(true);
    const g = presetConfig("phone-upright").gain;
    expect(g).toBeGreaterThanOrEqual(2); // beginners often use 2–3 (common practice)
    expect(g).toBeLessThanOrEqual(3);
    expect(presetConfig("phone-flat", { gain: 7 }).gain).toBe(7);
  });
});
