import { describe, expect, it } from "vitest";
import { defaultTransferConfig } from "../config";
import { gainAtSpeed } from "../gain/gainAtSpeed";
import { aboutDevice, aboutVertical, flat, STANDARD_GRAVITY, upright, virtualDeviceSamples } from "../testing/virtualDevice";
import { biasStep } from "./bias";
import { controlsParams, controlsStep, createControlsState } from "./controls";
import { deadBandStep } from "./deadBand";
import { displayUnitsStep } from "./displayUnits";
import { clearFineAimSmoothing, createFineAimSmoothingState, fineAimSmoothingStep } from "./fineAimSmoothing";
import { gainCurveStage } from "./gainCurve";
import { createGravityReferenceState, gravityReferenceStep, resetGravityReference } from "./gravityReference";
import { createHeadingStickState, headingStickStep } from "./headingStickChannel";
import { createLatencyState, latencyStep } from "./latency";
import { motionViewStep } from "./motionChannel";
import { pointerDeltaStep, pointerPositionStep } from "./pointerChannel";
import { referenceFrameStage } from "./referenceFrame";
import { createSampleClockState, sampleClockStep } from "./sampleClock";
import { createScreenRotationState, screenRotationStep } from "./screenRotation";
import { stickRateStep } from "./stickRateChannel";
import { createTiltReferenceState, resetTiltReference, tiltChannelStep } from "./tiltChannel";
import { createStageWork, type StageWork } from "./work";

// Each stage of the engine alone, on a work record set up by hand.
const workWith = (values: Partial<StageWork>): StageWork => Object.assign(createStageWork(), values);

describe("clock stage", () => {
  it("Δt from the samples' own time stamps (W3C Device Orientation and Motion: use event.timeStamp), 0 first, capped, refuses time going back", () => {
    const c = createSampleClockState(), w = createStageWork(), p = { maxGapMs: 100 };
    const dt = (tMs: number) => (sampleClockStep(c, p, { tMs }, w) ? w.dtMs : -1);
    expect(dt(1000)).toBe(0);
    expect(dt(1016.5)).toBeCloseTo(16.5, 12);
    expect(w.dtS).toBeCloseTo(0.0165, 12);
    expect(dt(5000)).toBe(100);
    expect(dt(4999)).toBe(-1);
    expect(c.lastMs).toBe(5000); // unchanged by the refused sample
  });
});

describe("controls stage (W3C Gamepad: buttons[i].pressed is bit i of the mask)", () => {
  const p = controlsParams({ ...defaultTransferConfig, clutchButton: 4, aimButton: 31, recenterButton: 2, activation: "while-aiming" });
  it("hold clutch, aim on the highest bit (31), recenter on the press only", () => {
    const s = createControlsState();
    controlsStep(s, p, { buttons: 2 ** 4 + 2 ** 31 + 2 ** 2 });
    expect([s.clutched, s.aiming, s.recenterPressed]).toEqual([true, true, true]);
    controlsStep(s, p, { buttons: 2 ** 31 + 2 ** 2 });
    expect([s.clutched, s.aiming, s.recenterPressed]).toEqual([false, true, false]);
    controlsStep(s, p, { buttons: 0 });
    expect(s.aiming).toBe(false);
  });
  it("toggle clutch flips on each press, not while held", () => {
    const t = controlsParams({ ...defaultTransferConfig, clutchMode: "toggle" });
    const s = createControlsState();
    const seen = [1, 1, 0, 0, 1, 0].map((b) => (controlsStep(s, t, { buttons: b }), s.clutched));
    expect(seen).toEqual([true, true, true, true, false, false]);
  });
});

describe("bias stage (science.md §8: subtract the mean rate at rest)", () => {
  it("subtracts per axis", () => {
    const w = createStageWork();
    biasStep(w, { x: 0.3, y: -0.2, z: 0.1 }, { gyroX: 1.3, gyroY: -0.2, gyroZ: 0 });
    expect([w.wx, w.wy, w.wz].map((v) => +v.toFixed(12))).toEqual([1, 0, -0.1]);
  });
});

describe("gravity reference stage, against three.js", () => {
  const params = { sign: 1, timeConstantS: 0.5 };
  it("seeds 'up' from the first reading: upright reads +g on y (W3C: accelerationIncludingGravity points up at rest)", () => {
    const [s] = virtualDeviceSamples(() => upright(), 0, 100);
    const g = createGravityReferenceState();
    gravityReferenceStep(g, params, createStageWork(), s!);
    expect(g.y).toBeCloseTo(1, 12);
  });
  it("an inverted accelerometer read with sign −1 gives the same 'up'", () => {
    const [s] = virtualDeviceSamples(() => flat(), 0, 100);
    const g = createGravityReferenceState();
    gravityReferenceStep(g, { sign: -1, timeConstantS: 0.5 }, createStageWork(), { accelX: -s!.accelX!, accelY: -s!.accelY!, accelZ: -s!.accelZ! });
    expect(g.z).toBeCloseTo(1, 12);
  });
  it("follows the gyroscope alone through a turn (dĝ/dt = −ω × ĝ), as three.js rotates the world's up", () => {
    const samples = virtualDeviceSamples((t) => upright().multiply(aboutDevice([1, 0.3, 0.2], -50 * (t / 1000))), 1000, 1000);
    const g = createGravityReferenceState();
    const w = createStageWork();
    gravityReferenceStep(g, params, w, samples[0]!);
    for (const s of samples.slice(1)) {
      w.dtS = 0.001;
      biasStep(w, { x: 0, y: 0, z: 0 }, s);
      gravityReferenceStep(g, params, w, {});
    }
    const last = samples[samples.length - 1]!;
    expect(g.x).toBeCloseTo(last.accelX! / STANDARD_GRAVITY, 3);
    expect(g.y).toBeCloseTo(last.accelY! / STANDARD_GRAVITY, 3);
    expect(g.z).toBeCloseTo(last.accelZ! / STANDARD_GRAVITY, 3);
  });
  it("reset seeds again from the next reading", () => {
    const g = createGravityReferenceState();
    gravityReferenceStep(g, params, createStageWork(), { accelX: 0, accelY: 9.8, accelZ: 0 });
    resetGravityReference(g);
    gravityReferenceStep(g, params, createStageWork(), { accelX: 9.8, accelY: 0, accelZ: 0 });
    expect(g.x).toBeCloseTo(1, 12);
  });
});

describe("screen-frame stage (W3C Screen Orientation: angle 90 = turned counter-clockwise)", () => {
  it("at 90° the screen's up is the device's x axis, its right the device's −y", () => {
    const w = workWith({ wx: 5, wy: 7, wz: 1 });
    screenRotationStep(createScreenRotationState(), { screenAngleDeg: 90 }, w, { x: 1, y: 0, z: 0 });
    expect(w.ry).toBeCloseTo(5, 12);
    expect(w.rx).toBeCloseTo(-7, 12);
    expect(w.rz).toBe(1);
    expect(w.uy).toBeCloseTo(1, 12);
  });
});

describe("reference-frame stage: the signs of science.md §8", () => {
  it("an upright device turned left (three.js, about the true vertical) gives a leftward rate", () => {
    const s = virtualDeviceSamples((t) => aboutVertical(30 * (t / 1000)).multiply(upright()), 100, 100)[5]!;
    const w = workWith({ rx: s.gyroX, ry: s.gyroY, rz: s.gyroZ, ux: 0, uy: 1, uz: 0 });
    for (const frame of ["device", "gravity", "adaptive"] as const) {
      referenceFrameStage(frame)(w, { axis: "screen-up", verticalSign: 1 });
      expect(w.rateX).toBeCloseTo(-30, 6);
    }
  });
  it("tilting the top edge away (negative about x, W3C right-hand rule) moves up; invertVertical flips it", () => {
    const w = workWith({ rx: -10 });
    referenceFrameStage("device")(w, { axis: "screen-up", verticalSign: 1 });
    expect(w.rateY).toBe(10);
    referenceFrameStage("device")(w, { axis: "screen-up", verticalSign: -1 });
    expect(w.rateY).toBe(-10);
  });
  it("every frame: an upright device (three.js) tipping its top edge away at 20°/s gives +20°/s up, −20 with invertVertical", () => {
    // W3C Device Orientation and Motion: z points at the viewer, so the top edge going away is a negative turn about x
    const s = virtualDeviceSamples((t) => upright().multiply(aboutDevice([1, 0, 0], -20 * (t / 1000))), 100, 100)[5]!;
    for (const frame of ["device", "gravity", "adaptive"] as const) {
      for (const verticalSign of [1, -1]) {
        const w = workWith({ rx: s.gyroX, ry: s.gyroY, rz: s.gyroZ, ux: 0, uy: 1, uz: 0 });
        referenceFrameStage(frame)(w, { axis: "screen-up", verticalSign });
        expect(w.rateY).toBeCloseTo(20 * verticalSign, 6);
        expect(w.rateX).toBeCloseTo(0, 9);
      }
    }
  });
});

describe("motion channel's last stage", () => {
  it("a view rate held over a sample is a view change of rate × Δt (30 deg/s for 100 ms is 3°), added to what other channels gave", () => {
    const w = workWith({ viewRateX: -30, viewRateY: 10, dtS: 0.1, viewX: 1, viewY: 0 });
    motionViewStep(w);
    expect(w.viewX).toBeCloseTo(-2, 12);
    expect(w.viewY).toBeCloseTo(1, 12);
  });
});

describe("dead-band and gain-curve stages", () => {
  it("dead band: 2 deg/s taken off a 3-4-5 rate keeps its direction", () => {
    const w = workWith({ rateX: 3, rateY: 4 });
    deadBandStep(w, { deadBandDegPerS: 2 });
    expect(w.speed).toBeCloseTo(3, 12);
    expect(w.rateX).toBeCloseTo(1.8, 12);
    expect(w.rateY).toBeCloseTo(2.4, 12);
  });
  it("gain 6 turns 5 deg/s into 30 deg/s of view (common practice: gain 6 makes a 30° turn 180°)", () => {
    const w = workWith({ rateX: 5, rateY: 0, speed: 5 });
    gainCurveStage("constant")(w, { curve: { ...defaultTransferConfig, gain: 6 }, horizontalMultiplier: 1, verticalMultiplier: 1 });
    expect(w.viewRateX).toBeCloseTo(30, 12);
  });
  it("each curve's stage gives what gainAtSpeed gives at that speed (one definition of the curves)", () => {
    for (const gainCurve of ["constant", "two-level", "power"] as const) {
      const curve = { ...defaultTransferConfig, gainCurve, gain: 3 };
      const w = workWith({ rateX: 12, rateY: 0, speed: 12 });
      gainCurveStage(gainCurve)(w, { curve, horizontalMultiplier: 1, verticalMultiplier: 1 });
      expect(w.viewRateX).toBe(gainAtSpeed(curve, 12) * 12);
    }
  });
});

describe("fine-aim smoothing stage (science.md §8: only the slow share is smoothed)", () => {
  const p = { timeMs: 40, speedDegPerS: 10 };
  it("fast input passes unchanged and leaves nothing in the smoother", () => {
    const s = createFineAimSmoothingState();
    const w = workWith({ dtMs: 10, speed: 100, viewRateX: 100 });
    fineAimSmoothingStep(s, p, w);
    expect(w.viewRateX).toBe(100);
    expect(s.x).toBe(0);
  });
  it("input at rest speed is all slow share: the discretised RC filter's step response u(1 − (τ/(τ + Δt))ⁿ)", () => {
    // backward-Euler solution of τ·ds/dt = u − s (closed form of the difference equation)
    const s = createFineAimSmoothingState();
    const w = createStageWork();
    for (let n = 1; n <= 8; n++) {
      Object.assign(w, { dtMs: 10, speed: 0, viewRateX: 5, viewRateY: 0 });
      fineAimSmoothingStep(s, p, w);
      expect(w.viewRateX).toBeCloseTo(5 * (1 - (40 / 50) ** n), 12);
    }
  });
  it("half-way to the threshold, half the rate passes directly and only the other half is smoothed", () => {
    const s = createFineAimSmoothingState();
    const w = workWith({ dtMs: 10, speed: 5, viewRateX: 8 });
    fineAimSmoothingStep(s, p, w);
    expect(s.x).toBeCloseTo(4 * (10 / 50), 12); // the state follows (1 − w)·x = 4, not x = 8
    expect(w.viewRateX).toBeCloseTo(4 + 0.8, 12);
    clearFineAimSmoothing(s);
    expect(s.x).toBe(0);
  });
  it("the issue's worked case: 100 deg/s for 200 ms at gain 1 travels 20°, with or without τ = 40 or 100 ms", () => {
    for (const timeMs of [0, 40, 100]) {
      const s = createFineAimSmoothingState();
      const w = createStageWork();
      let total = 0;
      for (let t = 1; t <= 3000; t++) {
        const x = t <= 200 ? 100 : 0;
        Object.assign(w, { dtMs: 1, speed: x, viewRateX: x });
        fineAimSmoothingStep(s, { timeMs, speedDegPerS: 10 }, w);
        total += w.viewRateX * 0.001;
      }
      expect(total).toBeCloseTo(20, 9); // 100 deg/s × 0.2 s
    }
  });
});

describe("tilt-rate channel, against three.js", () => {
  const p = { deadZoneDeg: 2, maxDeg: 30, exponent: 1, maxRateDegPerS: 120, verticalSign: 1 };
  const upOf = (q: import("three").Quaternion) => {
    const [s] = virtualDeviceSamples(() => q, 0, 100);
    const n = Math.hypot(s!.accelX!, s!.accelY!, s!.accelZ!);
    return { ux: s!.accelX! / n, uy: s!.accelY! / n, uz: s!.accelZ! / n };
  };
  const run = (hold: import("three").Quaternion, tilted: import("three").Quaternion) => {
    const state = createTiltReferenceState();
    const w = workWith({ ...upOf(hold), dtS: 0 });
    tiltChannelStep(state, p, w, true);
    Object.assign(w, { ...upOf(tilted), dtS: 0.1, viewX: 0, viewY: 0 });
    tiltChannelStep(state, p, w, true);
    return w;
  };
  it("top edge away from the viewer (W3C: z points at the viewer, so a negative turn about x) moves up, held upright or flat", () => {
    for (const hold of [upright(), flat()]) {
      const w = run(hold, hold.clone().multiply(aboutDevice([1, 0, 0], -16)));
      expect(w.viewY).toBeCloseTo(((16 - 2) / 28) * 120 * 0.1, 6);
      expect(Math.abs(w.viewX)).toBeLessThan(1e-9);
    }
  });
  it("lowering the right edge of an upright device (a negative turn about the screen normal z) turns right", () => {
    const w = run(upright(), upright().multiply(aboutDevice([0, 0, 1], -16)));
    expect(w.viewX).toBeCloseTo(((16 - 2) / 28) * 120 * 0.1, 6);
  });
  it("inactive: the reference is still taken, nothing is added; reset takes a new one", () => {
    const state = createTiltReferenceState();
    const w = workWith({ ux: 0, uy: 1, uz: 0, dtS: 0.1 });
    tiltChannelStep(state, p, w, false);
    expect(state.set).toBe(true);
    expect(w.viewX).toBe(0);
    resetTiltReference(state);
    expect(state.set).toBe(false);
  });
});

describe("stick channels (W3C Gamepad standard mapping: axes −1..1, y down)", () => {
  const p = { deadZone: 0.15, outerEdge: 0.95, exponent: 2, maxRateDegPerS: 180, verticalSign: 1 };
  it("rate: pushed fully up looks up at the full rate; half-way follows m'^p (science.md §8)", () => {
    const w = workWith({ dtS: 0.1 });
    stickRateStep(p, w, { stickX: 0, stickY: -1 });
    expect(w.viewY).toBeCloseTo(18, 12);
    const h = workWith({ dtS: 1 });
    stickRateStep(p, h, { stickX: 0.55, stickY: 0 });
    expect(h.viewX).toBeCloseTo(45, 9); // ((0.55 − 0.15)/0.8)² × 180
    const inv = workWith({ dtS: 0.1 });
    stickRateStep({ ...p, verticalSign: -1 }, inv, { stickX: 0, stickY: -1 });
    expect(inv.viewY).toBeCloseTo(-18, 12);
  });
  it("heading: reaching the rim pushed right turns 90° over the turn time; clutched drops the rest of the turn", () => {
    const s = createHeadingStickState();
    const w = workWith({ dtMs: 50 });
    headingStickStep(s, { rimThreshold: 0.9, turnTimeMs: 100 }, w, { stickX: 1, stickY: 0 }, true);
    expect(w.viewX).toBeCloseTo(45, 12);
    w.viewX = 0;
    headingStickStep(s, { rimThreshold: 0.9, turnTimeMs: 100 }, w, { stickX: 1, stickY: 0 }, false);
    expect(w.viewX).toBe(0);
    expect(s.pendingTurn).toBe(0);
    headingStickStep(s, { rimThreshold: 0.9, turnTimeMs: 100 }, w, { stickX: 1, stickY: 0 }, true);
    expect(w.viewX).toBe(0); // still at the rim, the same heading: nothing new
  });
});

describe("display units and pointer channel", () => {
  it("cursor mode: px per degree, page y down (CSSOM: clientY grows downwards)", () => {
    const w = workWith({ viewX: 1, viewY: 2 });
    displayUnitsStep(w, { cursor: true, pixelsPerDegree: 10 });
    expect([w.outX, w.outY]).toEqual([10, -20]);
  });
  it("view mode: a drag up (negative clientY change) looks up; cursor mode moves the cursor up", () => {
    const v = workWith({});
    pointerDeltaStep({ cursor: false, gain: 0.2, verticalSign: 1 }, v, { pointerDx: 10, pointerDy: -5 });
    expect([v.outX, v.outY]).toEqual([2, 1]);
    const c = workWith({});
    pointerDeltaStep({ cursor: true, gain: 2, verticalSign: 1 }, c, { pointerDx: 10, pointerDy: -5 });
    expect([c.outX, c.outY]).toEqual([20, -10]);
  });
  it("an absolute touch sets the step so the position lands on the finger", () => {
    const w = workWith({ outX: 3, outY: 3 });
    pointerPositionStep(w, { x: 100, y: 50 }, { pointerX: 120, pointerY: 40 });
    expect([w.outX, w.outY]).toEqual([20, -10]);
  });
});

describe("latency stage", () => {
  it("holds a step back by the added latency, and passes it through at 0", () => {
    const line = createLatencyState(16);
    const out = { dx: 0, dy: 0 };
    const step = (delayMs: number, tMs: number, outX: number, outY: number) => latencyStep(line, { delayMs }, { tMs }, workWith({ outX, outY }), out);
    step(50, 0, 1, 2);
    expect(out).toEqual({ dx: 0, dy: 0 });
    step(50, 49, 0, 0);
    expect(out.dx).toBe(0);
    step(50, 50, 0, 0);
    expect(out).toEqual({ dx: 1, dy: 2 });
    step(0, 60, 7, 8);
    expect(out).toEqual({ dx: 7, dy: 8 });
  });
  it("a full queue releases its oldest step early and counts it", () => {
    const q = createLatencyState(2);
    const out = { dx: 0, dy: 0 };
    for (const t of [0, 1]) latencyStep(q, { delayMs: 100 }, { tMs: t }, workWith({ outX: 1, outY: 0 }), out);
    latencyStep(q, { delayMs: 100 }, { tMs: 2 }, workWith({ outX: 1, outY: 0 }), out);
    expect([out.dx, q.overflows, q.count]).toEqual([1, 1, 2]);
  });
});
