import { describe, expect, it } from "vitest";
import { parseTransferConfig } from "../config";
import { createSeededRandom } from "../simulate/prng";
import type { MotionSample } from "../sample";
import { aboutDevice, aboutVertical, flat, STANDARD_GRAVITY, upright, virtualDeviceSamples } from "../testing/virtualDevice";
import { checkAccelGyroAxes } from "./accelGyroAxesCheck";
import { checkGravityPosture } from "./gravityPostureCheck";
import { checkGravitySign, gravityCheckNeeded } from "./gravitySignCheck";

// A virtual device driven through known orientations by three.js (the reference library for
// rotations) gives the readings a W3C DeviceMotion source would: rotationRate in deg/s about the
// device axes and accelerationIncludingGravity pointing up at rest (W3C Device Orientation and
// Motion: lying flat, screen up, reads about +9.8 m/s² on z). Sources in the wild may report the
// accelerometer negated, or with an axis mirrored; both are made here from the same movement.

const rng = createSeededRandom(7);
/** Small hand tremor and sensor noise on top of the virtual device's readings. */
const noisy = (samples: MotionSample[], sdAccel = 0.05, sdGyro = 0.15): MotionSample[] =>
  samples.map((s) => ({
    ...s,
    gyroX: s.gyroX + sdGyro * rng.normal(), gyroY: s.gyroY + sdGyro * rng.normal(), gyroZ: s.gyroZ + sdGyro * rng.normal(),
    accelX: s.accelX! + sdAccel * rng.normal(), accelY: s.accelY! + sdAccel * rng.normal(), accelZ: s.accelZ! + sdAccel * rng.normal(),
  }));
const negated = (samples: MotionSample[]): MotionSample[] => samples.map((s) => ({ ...s, accelX: -s.accelX!, accelY: -s.accelY!, accelZ: -s.accelZ! }));
const mirrored = (axis: "x" | "y" | "z", samples: MotionSample[]): MotionSample[] =>
  samples.map((s) => ({ ...s, accelX: axis === "x" ? -s.accelX! : s.accelX, accelY: axis === "y" ? -s.accelY! : s.accelY, accelZ: axis === "z" ? -s.accelZ! : s.accelZ }));

/** Held still for 1.5 s in a hold (with a natural 25° lean back when upright). */
const held = (hold: import("three").Quaternion) => noisy(virtualDeviceSamples(() => hold.clone(), 1500, 60));
const leaningUpright = () => upright().multiply(aboutDevice([1, 0, 0], -25));
/** Tilting forward and back, then side to side, for 4 s (two different axes). */
const tilting = (hold: import("three").Quaternion) =>
  noisy(virtualDeviceSamples((t) => hold.clone().multiply(aboutDevice([1, 0, 0], 25 * Math.sin(t / 300) * (t < 2000 ? 1 : 0))).multiply(aboutDevice([0, 1, 0], 25 * Math.sin(t / 300) * (t >= 2000 ? 1 : 0))), 4000, 60));

describe("known posture (W3C: accelerationIncludingGravity points up at rest)", () => {
  it("the virtual device reads +9.8 on z lying flat, screen up, as the standard says", () => {
    expect(virtualDeviceSamples(() => flat(), 0, 60)[0]!.accelZ).toBeCloseTo(STANDARD_GRAVITY, 9);
  });
  it("held upright (leaning back 25°): fine as reported, inverted when negated", () => {
    expect(checkGravityPosture(held(leaningUpright()), "upright").verdict).toBe("fine");
    const inv = checkGravityPosture(negated(held(leaningUpright())), "upright");
    expect(inv.verdict).toBe("inverted");
    expect(inv.alignment).toBeLessThan(-0.8);
  });
  it("flat on a table: fine as reported, inverted when negated", () => {
    expect(checkGravityPosture(held(flat()), "flat").verdict).toBe("fine");
    expect(checkGravityPosture(negated(held(flat())), "flat").verdict).toBe("inverted");
  });
  it("upright in landscape (W3C Screen Orientation angle 90): the screen's top edge is the device's x axis", () => {
    const landscape = leaningUpright().multiply(aboutDevice([0, 0, 1], 90));
    const samples = held(landscape).map((s) => ({ ...s, screenAngleDeg: 90 }));
    expect(samples[0]!.accelX).toBeGreaterThan(8); // device x points up
    expect(checkGravityPosture(samples, "upright").verdict).toBe("fine");
    expect(checkGravityPosture(negated(samples), "upright").verdict).toBe("inverted");
  });
  it("cannot tell when held the other way than asked, when moving, or without readings; says what to do", () => {
    const wrongHold = checkGravityPosture(held(upright().multiply(aboutDevice([1, 0, 0], -70))), "upright");
    expect(wrongHold.verdict).toBe("cannot-tell");
    expect(wrongHold.message).toMatch(/upright/);
    const moving = virtualDeviceSamples((t) => aboutVertical(0).multiply(upright()).multiply(aboutDevice([1, 0, 0], 40 * Math.sin(t / 150))), 1500, 60);
    expect(checkGravityPosture(moving, "upright").message).toMatch(/moved/);
    expect(checkGravityPosture(moving.map(({ tMs, gyroX, gyroY, gyroZ }) => ({ tMs, gyroX, gyroY, gyroZ })), "upright").verdict).toBe("cannot-tell");
  });
});

describe("accelerometer axes against the gyroscope (dĝ/dt = −ω × ĝ)", () => {
  it("agree for the device as the standard defines it, held upright or flat", () => {
    for (const hold of [leaningUpright(), flat()]) {
      const r = checkAccelGyroAxes(tilting(hold));
      expect(r.verdict).toBe("agree");
      expect(r.scores.asIs).toBeGreaterThan(0.9);
    }
  });
  it("agree also with the whole accelerometer negated (the equation is linear: the posture check finds that)", () => {
    expect(checkAccelGyroAxes(negated(tilting(leaningUpright()))).verdict).toBe("agree");
  });
  it("find a mirrored axis, whichever it is", () => {
    for (const axis of ["x", "y", "z"] as const) {
      const r = checkAccelGyroAxes(mirrored(axis, tilting(leaningUpright())));
      expect(r.verdict, axis).toBe("mirrored");
      expect(r.mirroredAxis).toBe(axis);
    }
  });
  it("do not depend on the gyroscope's unit (W3C Gyroscope reports rad/s)", () => {
    const rad = tilting(flat()).map((s) => ({ ...s, gyroX: (s.gyroX * Math.PI) / 180, gyroY: (s.gyroY * Math.PI) / 180, gyroZ: (s.gyroZ * Math.PI) / 180 }));
    expect(checkAccelGyroAxes(rad).verdict).toBe("agree");
  });
  it("cannot tell from a still device, or from a turn about one axis only (it cannot show whether that axis is mirrored)", () => {
    expect(checkAccelGyroAxes(held(flat())).verdict).toBe("cannot-tell");
    const oneAxis = noisy(virtualDeviceSamples((t) => leaningUpright().multiply(aboutDevice([1, 0, 0], 30 * Math.sin(t / 300))), 4000, 60));
    const r = checkAccelGyroAxes(mirrored("x", oneAxis));
    expect(r.verdict).toBe("cannot-tell");
    expect(r.message).toMatch(/side to side/);
  });
});

describe("the device check's verdict", () => {
  it("fine → use as is; inverted → accelerometerInverted true; mirrored → refuse; unclear → try again", () => {
    const hold = leaningUpright();
    expect(checkGravitySign({ posture: "upright", held: held(hold), tilting: tilting(hold) })).toMatchObject({ verdict: "fine", accelerometerInverted: false });
    expect(checkGravitySign({ posture: "upright", held: negated(held(hold)), tilting: negated(tilting(hold)) })).toMatchObject({ verdict: "inverted", accelerometerInverted: true });
    expect(checkGravitySign({ posture: "upright", held: held(hold), tilting: mirrored("y", tilting(hold)) })).toMatchObject({ verdict: "cannot-tell", accelerometerInverted: null, retry: false });
    expect(checkGravitySign({ posture: "flat", held: held(hold), tilting: tilting(hold) })).toMatchObject({ verdict: "cannot-tell", retry: true });
  });
  it("only the gravity and adaptive frames and tilt-rate need it", () => {
    expect(gravityCheckNeeded(parseTransferConfig({ frame: "device" }))).toBe(false);
    expect(gravityCheckNeeded(parseTransferConfig({ frame: "adaptive" }))).toBe(true);
    expect(gravityCheckNeeded(parseTransferConfig({ technique: "tilt-rate" }))).toBe(true);
    expect(gravityCheckNeeded(parseTransferConfig({ technique: "stick", frame: "gravity" }))).toBe(false);
  });
  it("an inverted source read with accelerometerInverted turns the view the same way as a correct one (gravity frame)", async () => {
    const { createMotionEngine } = await import("../engine");
    const { totalOutput } = await import("../testing/virtualDevice");
    const hold = leaningUpright().multiply(aboutDevice([0, 0, 1], 15));
    const turn = virtualDeviceSamples((t) => aboutVertical(40 * (t / 1000)).multiply(hold.clone()), 1000, 100);
    const right = totalOutput(createMotionEngine({ frame: "gravity" }).push, turn);
    const fixed = totalOutput(createMotionEngine({ frame: "gravity", accelerometerInverted: true }).push, negated(turn));
    const unfixed = totalOutput(createMotionEngine({ frame: "gravity" }).push, negated(turn));
    expect(right.x).toBeCloseTo(-40, 1);
    expect(fixed.x).toBeCloseTo(right.x, 9);
    expect(unfixed.x).toBeGreaterThan(30); // a flipped sign mirrors the horizontal axis
  });
});
