import type { SampleFragment, SampleSource } from "./types";

interface PermissionRequester {
  requestPermission?: () => Promise<"granted" | "denied">;
}

/**
 * Ask for motion-sensor permission where the browser requires it (requestMotionPermission).
 *
 * Purpose: iOS Safari needs `DeviceMotionEvent.requestPermission()` called from a user gesture
 * (a click handler); other browsers grant DeviceMotion in a secure context. Source: W3C Device
 * Orientation and Motion, permission model. Cost: one prompt.
 * @throws never; resolves "granted", "denied" or "unavailable" (no DeviceMotionEvent).
 * @example button.onclick = async () => { if ((await requestMotionPermission()) === "granted") await source.start(sink); };
 */
export async function requestMotionPermission(): Promise<"granted" | "denied" | "unavailable"> {
  if (typeof DeviceMotionEvent === "undefined") return "unavailable";
  const ctor = DeviceMotionEvent as unknown as PermissionRequester;
  if (typeof ctor.requestPermission !== "function") return "granted";
  try {
    return await ctor.requestPermission();
  } catch {
    return "denied";
  }
}

/** Current `screen.orientation.angle` (0 when unknown; older iOS: `window.orientation`). */
export function currentScreenAngle(win: Window): number {
  const angle = win.screen?.orientation?.angle;
  if (typeof angle === "number") return angle;
  const legacy = (win as unknown as { orientation?: number }).orientation;
  return typeof legacy === "number" ? (legacy + 360) % 360 : 0;
}

/**
 * DeviceMotion source (createDeviceMotionSource).
 *
 * Purpose: gyroscope (`rotationRate` alpha/beta/gamma = rates about x/y/z, deg/s) and
 * `accelerationIncludingGravity` (m/s²) from the W3C `devicemotion` event, stamped with
 * `event.timeStamp` (not `interval`), with the screen angle. Source: W3C Device Orientation and
 * Motion §devicemotion; W3C Screen Orientation. Cost: one fragment per event (≈ 60 Hz).
 * @throws Error from `start` when permission is denied or the event is unavailable.
 * @example const src = createDeviceMotionSource(window); await src.start((f) => mixer.accept(f));
 */
export function createDeviceMotionSource(win: Window, options: { askPermission?: boolean } = {}): SampleSource {
  let listener: ((e: DeviceMotionEvent) => void) | null = null;
  return {
    kind: "device-motion",
    async start(sink) {
      if (options.askPermission !== false) {
        const answer = await requestMotionPermission();
        if (answer !== "granted") throw new Error(`motion sensors: permission ${answer}`);
      }
      listener = (e: DeviceMotionEvent) => {
        const r = e.rotationRate, a = e.accelerationIncludingGravity;
        const f: SampleFragment = { tMs: e.timeStamp, inputMs: e.timeStamp, screenAngleDeg: currentScreenAngle(win) };
        if (r && r.alpha !== null && r.beta !== null && r.gamma !== null) f.gyro = { x: r.alpha, y: r.beta, z: r.gamma };
        if (a && a.x !== null && a.y !== null && a.z !== null) f.accel = { x: a.x, y: a.y, z: a.z };
        sink(f);
      };
      win.addEventListener("devicemotion", listener);
    },
    stop() {
      if (listener) win.removeEventListener("devicemotion", listener);
      listener = null;
    },
  };
}
