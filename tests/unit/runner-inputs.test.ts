import { describe, expect, it } from "vitest";
import { defaultTransferConfig, type Technique, type TransferConfig } from "@/lib/motion/config";
import {
  controlHelp, controlMasks, controlSet, controllerButtonName, createInputAgeLog, describeInputDetails, inputDetails, inputPathsFor,
  layoutFit, sequenceLayout, usesMotion, FIT_MARGIN_PX,
} from "@/lib/runner";
import { motionPermissionHelp, sensorBrowser } from "@/lib/runner/permissionHelp";

const config = (over: Partial<TransferConfig> = {}): TransferConfig => ({ ...defaultTransferConfig, ...over });

describe("input paths per technique", () => {
  it("the stick alone is clocked by the controller poll and needs no gyroscope; motion techniques by the gyroscope", () => {
    expect(inputPathsFor("stick", "cursor")).toEqual({ motion: false, gamepad: "required", pointer: "none", clock: "stick" });
    for (const t of ["motion", "motion+stick", "motion+touch", "tilt-rate"] as Technique[]) {
      expect(inputPathsFor(t, "view").clock).toBe("motion");
      expect(usesMotion(t)).toBe(true);
    }
    expect(inputPathsFor("motion+stick", "view").gamepad).toBe("required");
  });
  it("mouse through Pointer Lock; touch as the finger's position in cursor mode and as drag deltas in view mode", () => {
    expect(inputPathsFor("mouse", "view")).toMatchObject({ pointer: "lock", clock: "pointer", motion: false });
    expect(inputPathsFor("touch", "cursor").pointer).toBe("direct");
    expect(inputPathsFor("touch", "view").pointer).toBe("drag");
    expect(inputPathsFor("motion+touch", "cursor").pointer).toBe("drag");
  });
});

describe("controls", () => {
  it("stand for the condition's controller buttons as bits (W3C Gamepad standard mapping: buttons 0–16)", () => {
    expect(controlMasks({ clutchButton: 0, aimButton: 1, recenterButton: 2 }, 3)).toEqual({ select: 8, clutch: 1, aim: 2, recenter: 4 });
    expect(controlMasks({ clutchButton: null, aimButton: 6, recenterButton: null }, 0)).toEqual({ select: 1, clutch: 0, aim: 64, recenter: 0 });
  });
  it("name buttons by their place in the standard layout (W3C Gamepad, 'Standard Gamepad' figure: 0 bottom face, 7 right trigger, 16 centre)", () => {
    expect(controllerButtonName(0)).toContain("bottom face");
    expect(controllerButtonName(7)).toBe("the right trigger");
    expect(controllerButtonName(12)).toBe("the D-pad up");
    expect(controllerButtonName(16)).toContain("centre");
    expect(controllerButtonName(20)).toBe("button 20");
  });
  it("show pausing only where a device channel moves the aim, recentring only where there is a reference, aiming only while-aiming", () => {
    expect(controlSet("mouse", config(), "click")).toEqual({ select: false, clutch: false, aim: false, recenter: false });
    expect(controlSet("motion", config(), "button")).toEqual({ select: true, clutch: true, aim: false, recenter: true });
    expect(controlSet("stick", config(), "tap").recenter).toBe(false);
    expect(controlSet("stick", config({ stickMode: "heading" as TransferConfig["stickMode"] }), "tap").recenter).toBe(true);
    // activation gates the device channels only (docs/configuration.md, Buttons): no aim control where it would do nothing
    expect(controlSet("touch", config({ activation: "while-aiming" }), "tap").aim).toBe(false);
    expect(controlSet("mouse", config({ activation: "while-aiming" }), "click").aim).toBe(false);
    expect(controlSet("stick", config({ activation: "while-aiming" }), "button").aim).toBe(false);
    expect(controlSet("motion+touch", config({ activation: "while-aiming" }), "tap").aim).toBe(true);
  });
  it("tell each technique which control selects, naming only controls the device has", () => {
    const phone = { touchScreen: true, keyboard: false, controller: false };
    const desk = { touchScreen: false, keyboard: true, controller: false };
    expect(controlHelp("motion", config(), "button", 3, 600, "cursor", phone).select).toBe("tap the Select button");
    expect(controlHelp("motion", config(), "button", 3, 600, "cursor", desk).select).toBe("press Space");
    expect(controlHelp("stick", config(), "button", 3, 600, "view", desk).select).toBe("press Space or press the top face button (Y, or triangle)");
    expect(controlHelp("touch", config(), "tap", 3, 600, "cursor", phone).select).toBe("touch the highlighted target");
    expect(controlHelp("motion+touch", config(), "tap", 3, 600, "view", phone).select).toBe("tap the task area without moving your finger");
    expect(controlHelp("mouse", config(), "click", 3, 600, "cursor", desk)).toMatchObject({ select: "click", pause: null, recenter: null });
    expect(controlHelp("motion", config(), "dwell", 3, 800, "cursor", phone).select).toContain("0.8 s");
    expect(controlHelp("motion", config(), "tap", 3, 600, "cursor", phone).aim).toBe("Turn your device to move the cross.");
    expect(controlHelp("motion+stick", config({ activation: "while-aiming" }), "button", 3, 600, "view", { ...desk, controller: true }).aimHold)
      .toBe("Turning the device moves the aim only while you hold A, hold the right mouse button or hold the right face button (B, or circle); the thumbstick works at any time.");
    expect(controlHelp("motion", config(), "tap", 3, 600, "cursor", phone).recenter).toMatch(/^The Recenter button makes the way you hold the device now the new starting point/);
  });
});

describe("the ring fits the screen (ISO 9241-411 ring: diameter D = A / cos(π/(2n)))", () => {
  // A = 300, n = 13: D = 300 / cos(π/26) = 302.2 px; with W = 60 the outer extent is D + W = 362.2
  // across the targets at the ring's ends plus the margin each side
  it("fits a 412 px wide phone in portrait and says plainly what is needed when it does not", () => {
    const layout = sequenceLayout("ring", 13, 300, 60);
    const xs = layout.all.map((t) => Math.abs(t.x));
    const needed = 2 * (Math.max(...xs) + 30 + FIT_MARGIN_PX);
    expect(needed).toBeLessThan(300 / Math.cos(Math.PI / 26) + 60 + 2 * FIT_MARGIN_PX + 1e-9);
    expect(layoutFit(layout, 1, 412, 700)).toEqual({ fits: true });
    expect(layoutFit(layout, 1, 340, 700)).toMatchObject({ fits: false, advice: "larger-screen" });
    // in mm at 3.78 px/mm (a 96 dpi screen): 80 mm amplitude, 9 targets → about 360 px each way: too big either way for 400 × 250
    const mm = sequenceLayout("ring", 9, 80, 10);
    expect(layoutFit(mm, 3.78, 400, 250)).toMatchObject({ fits: false, advice: "larger-screen" });
    // two strips A = 300 apart, W = 40: 2·(150 + 20 + margin) across; a tall narrow screen holds them turned
    expect(layoutFit(sequenceLayout("strip", 9, 300, 40), 1, 300, 900)).toMatchObject({ fits: false, advice: "rotate", neededPx: { width: 356 } });
    // a ring is nearly as tall as it is wide: turning the screen does not help it
    expect(layoutFit(sequenceLayout("ring", 13, 300, 60), 1, 900, 360)).toMatchObject({ fits: false, advice: "larger-screen" });
    // a phone held sideways (915 × 412 window, bars taking 32 px across and 200 px down): the same ring fits the phone upright
    expect(layoutFit(sequenceLayout("ring", 13, 300, 60), 1, 883, 212, { width: 412 - 32, height: 915 - 200 })).toMatchObject({ fits: false, advice: "rotate" });
    expect(layoutFit(sequenceLayout("ring", 13, 300, 60), 1, 883, 212, { width: 340, height: 715 })).toMatchObject({ fits: false, advice: "larger-screen" });
  });
});

describe("input age at drawing", () => {
  it("is the time from each input's time stamp to the next drawn frame; median and 95th percentile", () => {
    const log = createInputAgeLog(64);
    for (const t of [100, 104, 108]) log.arrived(t);
    log.drawn(116.7); // ages 16.7, 12.7, 8.7
    log.arrived(NaN); // no new input: not counted
    log.arrived(120);
    log.drawn(133.4); // 13.4
    const s = log.summary()!;
    expect(s.n).toBe(4);
    expect(s.medianMs).toBeCloseTo((12.7 + 13.4) / 2, 9);
    expect(s.p95Ms).toBeGreaterThan(13.4); // between the two largest ages (simple-statistics' quantile interpolates)
    expect(s.p95Ms).toBeLessThanOrEqual(16.7 + 1e-9);
    expect(createInputAgeLog().summary()).toBeNull();
  });
});

describe("motion permission help", () => {
  it("recognises the browser from its User-Agent (the browsers' published formats) and says where to allow the sensors", () => {
    const iphone = "Mozilla/5.0 (iPhone; CPU iPhone OS 17_4 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.4 Mobile/15E148 Safari/604.1";
    const ipadDesktop = "Mozilla/5.0 (Macintosh; Intel Mac OS X 10_15_7) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.4 Safari/605.1.15";
    const pixel = "Mozilla/5.0 (Linux; Android 14; Pixel 7) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0.0.0 Mobile Safari/537.36";
    const samsung = "Mozilla/5.0 (Linux; Android 13; SM-S911B) AppleWebKit/537.36 (KHTML, like Gecko) SamsungBrowser/24.0 Chrome/117.0.0.0 Mobile Safari/537.36";
    expect(sensorBrowser(iphone, 5)).toBe("ios-safari");
    expect(sensorBrowser(ipadDesktop, 5)).toBe("ios-safari");
    expect(sensorBrowser(ipadDesktop, 0)).toBe("desktop");
    expect(sensorBrowser(pixel, 5)).toBe("android-chrome");
    expect(sensorBrowser(samsung, 5)).toBe("samsung-internet");
    expect(motionPermissionHelp("android-chrome").join(" ")).toContain("Motion sensors");
    expect(motionPermissionHelp("ios-safari")[0]).toContain("Allow");
  });
});

describe("the monitor's input details", () => {
  it("come from the latest sequence, else from the device check, else none", () => {
    const q = { sampleRateHz: 59.8, inputApis: ["generic-sensor", "gamepad"], pointerLockRaw: null, inputAgeMedianMs: 9.25, inputAgeP95Ms: 17.1 };
    expect(inputDetails(q, { inputApis: ["device-motion"], sampleRateHz: 60 })).toMatchObject({ from: "sequence", apis: ["generic-sensor", "gamepad"], rateHz: 59.8 });
    expect(inputDetails({ sampleRateHz: 60 }, { inputApis: ["device-motion"], sampleRateHz: 61 })).toMatchObject({ from: "device check", rateHz: 61 });
    expect(inputDetails({ sampleRateHz: 60 }, null)).toBeNull();
    expect(describeInputDetails(inputDetails(q, null)!)).toBe("Generic Sensor API + Gamepad API, 60 Hz, input age 9.3 ms median, 17.1 ms p95 (sequence)");
    expect(describeInputDetails(inputDetails({ inputApis: ["pointer-lock"], sampleRateHz: 125, pointerLockRaw: false }, null)!)).toContain("mouse not raw");
  });
  it("say when the device check found the accelerometer negated (and the runner turns it round) or an axis mirrored", () => {
    const q = { sampleRateHz: 60, inputApis: ["device-motion"] };
    expect(inputDetails(q, { gravitySign: "inverted" })?.gravitySign).toBe("inverted");
    expect(describeInputDetails(inputDetails(q, { gravitySign: "inverted" })!)).toContain("accelerometer negated, turned round");
    expect(describeInputDetails(inputDetails(null, { inputApis: ["device-motion"], gravitySign: "mirrored" })!)).toContain("mirrored, refused");
    expect(inputDetails(q, { gravitySign: "sideways" })?.gravitySign).toBeNull();
    expect(inputDetails(q, null)?.gravitySign).toBeNull();
  });
});
