import { describe, expect, it } from "vitest";
import { createMotionEngine } from "../engine";
import { createDeviceMotionSource } from "./deviceMotion";
import { createGamepadSource, gamepadButtonMask } from "./gamepad";
import { createGenericSensorSource } from "./genericSensor";
import { createSampleMixer } from "./mixer";
import { createScriptedSource } from "./scripted";
import type { SampleFragment } from "./types";

/** A stand-in window: records listeners so a test can fire events (node has no DOM). */
function fakeWindow(angle: number) {
  const listeners = new Map<string, (e: unknown) => void>();
  return {
    win: {
      screen: { orientation: { angle } },
      addEventListener: (type: string, fn: (e: unknown) => void) => listeners.set(type, fn),
      removeEventListener: (type: string) => listeners.delete(type),
    } as unknown as Window,
    fire: (type: string, e: unknown) => listeners.get(type)?.(e),
    has: (type: string) => listeners.has(type),
  };
}

describe("DeviceMotion adapter (W3C Device Orientation and Motion)", () => {
  it("maps rotationRate alpha/beta/gamma to rates about x/y/z, uses event.timeStamp and the screen angle", async () => {
    const w = fakeWindow(90);
    const got: SampleFragment[] = [];
    const src = createDeviceMotionSource(w.win, { askPermission: false });
    await src.start((f) => got.push(f));
    w.fire("devicemotion", { timeStamp: 123.4, interval: 16, rotationRate: { alpha: 1, beta: 2, gamma: 3 }, accelerationIncludingGravity: { x: 0.1, y: 9.7, z: 0.2 } });
    expect(got[0]).toEqual({ tMs: 123.4, inputMs: 123.4, screenAngleDeg: 90, gyro: { x: 1, y: 2, z: 3 }, accel: { x: 0.1, y: 9.7, z: 0.2 } });
    src.stop();
    expect(w.has("devicemotion")).toBe(false);
  });
  it("does nothing at import or creation time", () => {
    const w = fakeWindow(0);
    createDeviceMotionSource(w.win);
    expect(w.has("devicemotion")).toBe(false);
  });
});

describe("Gamepad buttons (W3C Gamepad standard mapping: buttons 0–16)", () => {
  it("packs pressed buttons into a bitmask", () => {
    expect(gamepadButtonMask([{ pressed: true }, { pressed: false }, { pressed: true }])).toBe(5);
    const all = Array.from({ length: 17 }, () => ({ pressed: true }));
    expect(gamepadButtonMask(all)).toBe(2 ** 17 - 1);
  });
});

describe("mixer and scripted source", () => {
  it("emits a sample per gyroscope fragment, holding the stick and summing pointer deltas", () => {
    const m = createSampleMixer("motion");
    expect(m.accept({ tMs: 0, stick: { x: 0.5, y: 0 }, buttons: 2 })).toBeNull();
    expect(m.accept({ tMs: 1, pointer: { dx: 3, dy: 1 } })).toBeNull();
    expect(m.accept({ tMs: 2, pointer: { dx: 2, dy: -4 } })).toBeNull();
    const s = m.accept({ tMs: 3, gyro: { x: 1, y: 2, z: 3 } })!;
    expect(s).toMatchObject({ tMs: 3, gyroX: 1, stickX: 0.5, buttons: 2, pointerDx: 5, pointerDy: -3 });
    expect(m.accept({ tMs: 4, gyro: { x: 0, y: 0, z: 0 } })!.pointerDx).toBeUndefined();
  });
  it("a scripted stream through mixer and engine gives the same output as pushing the samples directly", async () => {
    const samples = Array.from({ length: 50 }, (_, k) => ({ tMs: k * 10, gyroX: Math.sin(k), gyroY: 20 * Math.cos(k / 5), gyroZ: 3, buttons: k > 40 ? 1 : 0 }));
    const direct = createMotionEngine({ gain: 4 }), viaSource = createMotionEngine({ gain: 4 });
    let a = 0, b = 0;
    for (const s of samples) a += direct.push(s)!.dx;
    const mixer = createSampleMixer("motion");
    await createScriptedSource(samples).start((f) => {
      const s = mixer.accept(f);
      if (s) b += viaSource.push(s)!.dx;
    });
    expect(b).toBeCloseTo(a, 12);
    expect(a).not.toBe(0);
  });
});

describe("mixer clocks (W3C Gamepad: polled, no events)", () => {
  it("the stick clock makes a sample on every controller poll, so a held stick keeps its rate", () => {
    const m = createSampleMixer("stick");
    expect(m.accept({ tMs: 0, controls: 1 })).toBeNull();
    const a = m.accept({ tMs: 16.7, stick: { x: 0.8, y: 0 }, buttons: 4, inputMs: 10 })!;
    const b = m.accept({ tMs: 33.4, stick: { x: 0.8, y: 0 }, buttons: 4 })!;
    expect([a.tMs, a.stickX, a.buttons, b.tMs, b.stickX]).toEqual([16.7, 0.8, 5, 33.4, 0.8]);
    expect(m.lastInputMs).toBeNaN(); // the second poll brought nothing new
  });
  it("controls and the controller's buttons are one bitmask; a pulse lasts one sample; times never go backwards", () => {
    const m = createSampleMixer("motion");
    m.accept({ tMs: 1, buttons: 8 });
    m.accept({ tMs: 2, controls: 1, pulse: 4 });
    const s1 = m.accept({ tMs: 10, gyro: { x: 0, y: 0, z: 0 }, inputMs: 10 })!;
    const s2 = m.accept({ tMs: 9, gyro: { x: 0, y: 0, z: 0 } })!;
    expect([s1.buttons, s2.buttons, s2.tMs]).toEqual([13, 9, 10]);
  });
  it("the pointer clock makes a sample per pointer event, with the finger's position only on its own sample", () => {
    const m = createSampleMixer("pointer");
    const s = m.accept({ tMs: 5, position: { x: 120, y: 40 }, inputMs: 5 })!;
    expect([s.pointerX, s.pointerY]).toEqual([120, 40]);
    expect(m.accept({ tMs: 6, pointer: { dx: 1, dy: 0 } })!.pointerX).toBeUndefined();
  });
});

describe("Gamepad source (W3C Gamepad standard mapping: axes 2/3 the right stick, y down)", () => {
  it("reads the right stick and the buttons on each poll; the input time is the pad's timestamp when it changed", async () => {
    let stamp = 100;
    const pad = { connected: true, mapping: "standard", timestamp: 0, axes: [0, 0, 0.5, -0.25], buttons: [{ pressed: false }, { pressed: true }] };
    const win = { navigator: { getGamepads: () => [null, { ...pad, timestamp: stamp }] }, requestAnimationFrame: () => 0, cancelAnimationFrame: () => undefined, performance: { now: () => 0 } } as unknown as Window;
    const got: SampleFragment[] = [];
    const src = createGamepadSource(win, { stick: "right" });
    await src.start((f) => got.push(f));
    src.poll(116);
    src.poll(132);
    stamp = 140;
    src.poll(148);
    expect(got.map((f) => [f.tMs, f.stick?.x, f.stick?.y, f.buttons, f.inputMs])).toEqual([[116, 0.5, -0.25, 2, 100], [132, 0.5, -0.25, 2, undefined], [148, 0.5, -0.25, 2, 140]]);
  });
});

describe("Generic Sensor source (W3C Gyroscope: rad/s)", () => {
  /** A stand-in sensor class: the test sets a reading and fires "reading". */
  function fakeSensors() {
    const made: Array<EventTarget & { x: number | null; y: number | null; z: number | null; timestamp: number | null; fire(t: number, v: [number, number, number]): void }> = [];
    class FakeSensor extends EventTarget {
      x: number | null = null; y: number | null = null; z: number | null = null; timestamp: number | null = null;
      constructor() {
        super();
        made.push(this);
      }
      start() {
        queueMicrotask(() => this.dispatchEvent(new Event("activate")));
      }
      stop() {}
      fire(t: number, v: [number, number, number]) {
        [this.x, this.y, this.z] = v;
        this.timestamp = t;
        this.dispatchEvent(new Event("reading"));
      }
    }
    return { made, win: { Gyroscope: FakeSensor, Accelerometer: FakeSensor, screen: { orientation: { angle: 0 } }, performance: { now: () => 0 } } as unknown as Window };
  }
  it("converts rad/s to deg/s and joins the latest accelerometer reading", async () => {
    const { made, win } = fakeSensors();
    const got: SampleFragment[] = [];
    const src = createGenericSensorSource(win, 240);
    await src.start((f) => got.push(f));
    made[1]!.fire(0, [0, 0, 9.8]);
    made[0]!.fire(10, [Math.PI / 180, 0, -Math.PI / 90]);
    expect(got[0]!.gyro!.x).toBeCloseTo(1, 12);
    expect(got[0]!.gyro!.z).toBeCloseTo(-2, 12);
    expect(got[0]!.accel).toEqual({ x: 0, y: 0, z: 9.8 });
  });
  it("fills a quiet stretch (no reading while the value stays within the change threshold) with the held reading at 60 Hz", async () => {
    const { made, win } = fakeSensors();
    const got: SampleFragment[] = [];
    const src = createGenericSensorSource(win, 240);
    await src.start((f) => got.push(f));
    const deg = Math.PI / 180;
    made[0]!.fire(0, [30 * deg, 0, 0]);
    src.poll(40); // 40 ms without a reading: perhaps only late; nothing yet
    expect(got).toHaveLength(1);
    src.poll(70); // a quiet of more than three periods: held readings up to two periods before now
    expect(got.map((f) => Math.round(f.tMs * 10) / 10)).toEqual([0, 16.7, 33.3]);
    made[0]!.fire(100, [0, 0, 0]); // the next reading fills the rest of the gap by its own time stamp
    expect(got.map((f) => Math.round(f.tMs * 10) / 10)).toEqual([0, 16.7, 33.3, 50, 66.7, 83.3, 100]);
    expect(got.slice(0, 6).every((f) => Math.abs(f.gyro!.x - 30) < 1e-9)).toBe(true);
    expect(got.filter((f) => f.inputMs !== undefined)).toHaveLength(2); // only real readings are new input
    expect(src.readings).toBe(2);
  });
});
