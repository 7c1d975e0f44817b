import { describe, expect, it } from "vitest";
import { studyDesignSchema } from "@/lib/study/design";
import { allowedDeviceClasses, deviceClasses, expectedSessionTime, fitReport, targetFit } from ".";

const phonePortrait = deviceClasses.find((d) => d.id === "phone-portrait")!;
const laptop = deviceClasses.find((d) => d.id === "laptop")!;

describe("fit of the targets (ISO 9241-411 ring: A = D·cos(π/(2n)), science.md §1)", () => {
  it("a 9-target ring of A = 300 px needs D = 300 / cos 10° = 304.63 px (cos 10° = 0.98481, trigonometric tables) plus W", () => {
    const r = targetFit({ type: "ring", displayMode: "cursor", unit: "px", targetsPerRing: 9 }, 300, 40, laptop);
    expect(r.needed).toBeCloseTo(304.63 + 40, 1);
    expect(r.fits).toBe(true);
  });
  it("the finished demo's 480 px ring with 60 px targets does not fit a portrait phone 390 px wide", () => {
    const r = targetFit({ type: "ring", displayMode: "cursor", unit: "px", targetsPerRing: 9 }, 480, 60, phonePortrait);
    expect(r.fits).toBe(false);
    expect(r.available).toBe(390 - 16);
  });
  it("mm: 20 mm targets are 20 mm on every screen; visual degrees: 1° at 550 mm is 9.6 mm (2·d·tan 0.5°, standard visual-angle geometry)", () => {
    expect(targetFit({ type: "ring", displayMode: "cursor", unit: "mm", targetsPerRing: 13 }, 60, 20, laptop).targetMm).toBeCloseTo(20, 9);
    expect(targetFit({ type: "ring", displayMode: "cursor", unit: "deg-visual", targetsPerRing: 13 }, 10, 1, laptop).targetMm).toBeCloseTo(2 * 550 * Math.tan(Math.PI / 360), 9);
  });
  it("view mode: a 40° ring with 4° targets fits the 60° vertical field of view of a laptop but not the narrower one of a portrait phone", () => {
    const task = { type: "ring" as const, displayMode: "view" as const, unit: "deg-view" as const, targetsPerRing: 13 };
    expect(targetFit(task, 40, 4, laptop).fits).toBe(true);
    // portrait 390 × 700: horizontal fov = 2·atan(tan 30° · 390/700) = 35.7°
    const p = targetFit(task, 40, 4, phonePortrait);
    expect(p.available).toBeCloseTo(35.7, 1);
    expect(p.fits).toBe(false);
  });
  it("techniques choose the screens: mouse and stick run on a laptop, touch on phones and tablets", () => {
    expect(allowedDeviceClasses(["mouse", "stick"]).map((d) => d.id)).toEqual(["laptop"]);
    expect(allowedDeviceClasses(["touch"]).map((d) => d.id)).toEqual(["phone-portrait", "phone-landscape", "tablet"]);
  });
  it("the report warns per device class", () => {
    const design = studyDesignSchema.parse({
      factors: [{ name: "technique", levels: [{ label: "motion", config: { technique: "motion" } }, { label: "touch", config: { technique: "touch" } }] }],
      task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [240, 480], widths: [24, 60], targetsPerRing: 9 },
      counterbalancing: { method: "williams", seed: 1 },
    });
    const r = fitReport(design);
    expect(r.warnings.some((w) => w.startsWith("phone, portrait: A 480 × W 24 px, A 480 × W 60 px do not fit"))).toBe(true);
    expect(r.warnings.some((w) => w.startsWith("laptop"))).toBe(false);
  });
});

describe("expected minutes from the simulated participant", () => {
  const base = {
    task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [300], widths: [40], targetsPerRing: 9, practiceSequences: 0 },
    counterbalancing: { method: "williams", seed: 1 }, minBreakSeconds: 0,
    finalQuestionnaire: { ageBand: false, handedness: false, experience: false, comments: false },
  };
  it("movement time follows the simulated person's Fitts law: MT = 300 + 150·log2(300/40 + 1) = 763 ms (science.md §9), with its dwell", () => {
    const d = studyDesignSchema.parse({ ...base, factors: [{ name: "t", levels: [{ label: "motion", config: { gain: 3 } }] }] });
    const time = expectedSessionTime(d);
    expect(time.conditions[0]!.method).toBe("simulated");
    expect(time.conditions[0]!.meanMovementMs).toBeGreaterThan(700);
    expect(time.conditions[0]!.meanMovementMs).toBeLessThan(830);
  });
  it("added latency and smoothing lengthen each movement's still dwell, so the session takes longer", () => {
    const d = studyDesignSchema.parse({ ...base, factors: [{ name: "lat", levels: [{ label: "none", config: {} }, { label: "200 ms", config: { addedLatencyMs: 200, smoothingTimeMs: 100 } }] }] });
    const [a, b] = expectedSessionTime(d).conditions;
    // dwell 100 ms vs 100 + 200 + 3·100 = 600 ms: MT is at least dwell + 150 ms = 750 ms, so the slower one is no faster
    expect(b!.meanMovementMs).toBeGreaterThanOrEqual(a!.meanMovementMs - 30);
  });
});
