import { describe, expect, it } from "vitest";
import { createMotionEngine } from "../engine";
import { createDeviceMotionSource } from "./deviceMotion";
import { gamepadButtonMask } from "./gamepad";
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
    expect(got[0]).toEqual({ tMs: 123.4, screenAngleDeg: 90, gyro: { x: 1, y: 2, z: 3 }, accel: { x: 0.1, y: 9.7, z: 0.2 } });
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
