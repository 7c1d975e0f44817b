import { describe, expect, it } from "vitest";
import { createMotionEngine } from "../engine";
import { aboutDevice, aboutVertical, aboutWorld, flat, totalOutput, upright, virtualDeviceSamples } from "../testing/virtualDevice";
import { screenFrameX, screenFrameY } from "./screenFrame";

// Reference: W3C Device Orientation and Motion (device frame x right, y top, z out of the screen;
// rotationRate alpha/beta/gamma about x/y/z in deg/s, right-hand rule) and three.js (rotations).
describe("W3C device axes and units, checked with three.js rotations", () => {
  it("a flat device turned left at 90°/s reports +90 deg/s about z (W3C: gamma is about z)", () => {
    const samples = virtualDeviceSamples((t) => aboutVertical(90 * (t / 1000)).multiply(flat()), 1000, 100);
    const s = samples[50]!;
    expect(s.gyroZ).toBeCloseTo(90, 6);
    expect(s.gyroX).toBeCloseTo(0, 6);
    expect(s.gyroY).toBeCloseTo(0, 6);
    // accelerationIncludingGravity ≈ +9.8 on z lying flat, screen up (W3C)
    expect(s.accelZ).toBeCloseTo(9.80665, 6);
  });

  it("an upright device turned left reports the rate about y (W3C: beta is about y) and moves the view left by the turn", () => {
    const samples = virtualDeviceSamples((t) => aboutVertical(40 * (t / 1000)).multiply(upright()), 1000, 100);
    expect(samples[10]!.gyroY).toBeCloseTo(40, 6);
    const e = createMotionEngine({ frame: "device", deviceHorizontalAxis: "screen-up", gain: 1 });
    const out = totalOutput(e.push, samples);
    expect(out.x).toBeCloseTo(-40, 6); // gain 1 is 1:1 (common practice); left is negative
    expect(out.y).toBeCloseTo(0, 9);
  });

  it("tilting the top edge of an upright device towards the viewer (positive rate about x) moves the view down; away moves it up", () => {
    const samples = virtualDeviceSamples((t) => upright().multiply(aboutDevice([1, 0, 0], 20 * (t / 1000))), 1000, 100);
    expect(samples[10]!.gyroX).toBeCloseTo(20, 6);
    const out = totalOutput(createMotionEngine({ gain: 1 }).push, samples);
    // W3C: z points out of the screen towards the viewer, so +x rotation brings the top edge towards
    // the viewer; science.md §8: "tilting its top away moves it up".
    expect(out.y).toBeCloseTo(-20, 6);
  });

  it("a screen turned 90° counter-clockwise maps screen up to device x and screen right to device −y", () => {
    // W3C Screen Orientation: angle 90 = device turned 90° counter-clockwise from natural.
    expect(screenFrameY(1, 0, 90)).toBeCloseTo(1, 12);
    expect(screenFrameX(0, 1, 90)).toBeCloseTo(-1, 12);
    expect(screenFrameX(0, 1, 270)).toBeCloseTo(1, 12);
    expect(screenFrameY(0, 1, 180)).toBeCloseTo(-1, 12);
  });

  it("a landscape device (angle 90) turned left moves the view left only when the screen angle is applied", () => {
    const landscape = upright().multiply(aboutDevice([0, 0, 1], 90)); // device x now points up
    const samples = virtualDeviceSamples((t) => aboutVertical(30 * (t / 1000)).multiply(landscape.clone()), 1000, 100);
    expect(samples[10]!.gyroX).toBeCloseTo(30, 6); // the turn is about device x
    const withAngle = samples.map((s) => ({ ...s, screenAngleDeg: 90 }));
    expect(totalOutput(createMotionEngine({ gain: 2 }).push, withAngle).x).toBeCloseTo(-60, 6);
    // without the angle the same turn reads as pitch, not yaw: the mapping matters
    expect(totalOutput(createMotionEngine({ gain: 2 }).push, samples).x).toBeCloseTo(0, 6);
  });
});

describe("gravity frame against three.js", () => {
  // a device held upright, pitched back 35° and rolled 12°, turned 50° left about the true vertical
  const hold = upright().multiply(aboutDevice([1, 0, 0], -35)).multiply(aboutDevice([0, 0, 1], 12));
  const samples = virtualDeviceSamples((t) => aboutVertical(50 * (t / 1000)).multiply(hold.clone()), 1000, 200);

  it("turns the view by the rotation about the true vertical, times the gain", () => {
    const out = totalOutput(createMotionEngine({ frame: "gravity", gain: 3 }).push, samples);
    expect(out.x).toBeCloseTo(-150, 1);
  });

  it("differs from the device frame on a tilted hold (so the check can fail)", () => {
    const device = totalOutput(createMotionEngine({ frame: "device", gain: 3 }).push, samples);
    expect(Math.abs(device.x + 150)).toBeGreaterThan(10);
  });

  it("reads no horizontal turn from a rotation about a horizontal world axis", () => {
    const pitch = virtualDeviceSamples((t) => aboutWorld([1, 0, 0], 25 * (t / 1000)).multiply(hold.clone()), 1000, 200);
    const out = totalOutput(createMotionEngine({ frame: "gravity", gain: 3 }).push, pitch);
    expect(Math.abs(out.x)).toBeLessThan(0.5);
    expect(out.y).toBeLessThan(-50); // this world rotation brings the top edge towards the viewer: down
  });

  it("estimates gravity by fusing the gyroscope: it follows a fast turn that a slow accelerometer filter alone would lag", () => {
    const e = createMotionEngine({ frame: "gravity", gravityFilterTimeMs: 2000 });
    const tilt = virtualDeviceSamples((t) => upright().multiply(aboutDevice([1, 0, 0], -60 * Math.min(1, t / 200))), 300, 200);
    for (const s of tilt) e.push(s);
    const up = { x: 0, y: 0, z: 0 };
    e.readUp(up);
    const last = tilt[tilt.length - 1]!;
    const n = Math.hypot(last.accelX!, last.accelY!, last.accelZ!);
    expect(up.y).toBeCloseTo(last.accelY! / n, 2);
    expect(up.z).toBeCloseTo(last.accelZ! / n, 2);
  });
});

describe("adaptive frame against three.js", () => {
  // a person turning left and right about the true vertical, with a small pitch wobble
  const path = (base: () => import("three").Quaternion) => (t: number) =>
    aboutVertical(25 * Math.sin(t / 300)).multiply(base()).multiply(aboutDevice([1, 0, 0], 3 * Math.sin(t / 170)));

  it("equals the device frame (screen-normal axis) when held flat", () => {
    const s = virtualDeviceSamples(path(flat), 2000, 100);
    const adaptive = totalOutput(createMotionEngine({ frame: "adaptive", gain: 2 }).push, s);
    const device = totalOutput(createMotionEngine({ frame: "device", deviceHorizontalAxis: "screen-normal", gain: 2 }).push, s);
    expect(adaptive.x).toBeCloseTo(device.x, 1);
    expect(adaptive.y).toBeCloseTo(device.y, 9);
    expect(Math.abs(device.x)).toBeGreaterThan(5);
  });

  it("uses the screen-up axis when held upright", () => {
    const s = virtualDeviceSamples(path(upright), 2000, 100);
    const adaptive = totalOutput(createMotionEngine({ frame: "adaptive", gain: 2 }).push, s);
    const screenUp = totalOutput(createMotionEngine({ frame: "device", deviceHorizontalAxis: "screen-up", gain: 2 }).push, s);
    const screenNormal = totalOutput(createMotionEngine({ frame: "device", deviceHorizontalAxis: "screen-normal", gain: 2 }).push, s);
    expect(adaptive.x).toBeCloseTo(screenUp.x, 1);
    expect(Math.abs(adaptive.x - screenNormal.x)).toBeGreaterThan(1);
  });
});
