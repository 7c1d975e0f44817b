/** How a session's input reached the page, for the live monitor: the latest sequence's figures, or the device check's before any. */
export interface InputDetails {
  from: "sequence" | "device check";
  apis: string[];
  rateHz: number | null;
  /** Mouse: raw Pointer Lock movement; null when no pointer lock was used. */
  pointerLockRaw: boolean | null;
  ageMedianMs: number | null;
  ageP95Ms: number | null;
  /** The device check's gravity sign ("inverted": the runner turns the accelerometer round), or null when not checked. */
  gravitySign: "normal" | "inverted" | "mirrored" | null;
}

type Stored = Record<string, unknown> | null | undefined;
const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
const strings = (v: unknown): string[] => (Array.isArray(v) ? v.filter((x): x is string => typeof x === "string") : []);

/**
 * A session's input details from what it stored (inputDetails): the latest sequence's quality
 * figures (input paths, sample rate, raw pointer, input age at drawing) when there is one, else
 * the device check's; null when neither names its input paths (pages from before they were
 * recorded). Source: the runner's quality and device records (lib/runner/batch.ts,
 * requests.ts). Cost: O(1).
 * @throws never.
 * @example inputDetails({ sampleRateHz: 60, inputApis: ["device-motion"], inputAgeMedianMs: 9 }, null)?.apis // ["device-motion"]
 */
export function inputDetails(latestQuality: Stored, device: Stored): InputDetails | null {
  const q = latestQuality && strings(latestQuality.inputApis).length > 0 ? latestQuality : null;
  const d = !q && device && strings(device.inputApis).length > 0 ? device : null;
  const src = q ?? d;
  if (!src) return null;
  return {
    from: q ? "sequence" : "device check",
    apis: strings(src.inputApis),
    rateHz: num(src.sampleRateHz) ?? num(src.controllerRateHz),
    pointerLockRaw: typeof src.pointerLockRaw === "boolean" ? src.pointerLockRaw : null,
    ageMedianMs: num(src.inputAgeMedianMs),
    ageP95Ms: num(src.inputAgeP95Ms),
    gravitySign: device && (device.gravitySign === "normal" || device.gravitySign === "inverted" || device.gravitySign === "mirrored") ? device.gravitySign : null,
  };
}

const API_WORDS: Record<string, string> = {
  "generic-sensor": "Generic Sensor API", "device-motion": "DeviceMotion", gamepad: "Gamepad API", "pointer-lock": "Pointer Lock",
  "pointer-move": "plain mouse movement", "touch-drag": "touch drag", "touch-direct": "touch position",
};

/** The input details in words for the monitor's table cell. */
export function describeInputDetails(d: InputDetails): string {
  const parts = [d.apis.map((a) => API_WORDS[a] ?? a).join(" + ")];
  if (d.rateHz !== null) parts.push(`${Math.round(d.rateHz)} Hz`);
  if (d.pointerLockRaw !== null) parts.push(d.pointerLockRaw ? "raw mouse" : "mouse not raw");
  if (d.ageMedianMs !== null) parts.push(`input age ${d.ageMedianMs.toFixed(1)} ms median${d.ageP95Ms !== null ? `, ${d.ageP95Ms.toFixed(1)} ms p95` : ""}`);
  if (d.gravitySign === "inverted") parts.push("accelerometer negated, turned round");
  if (d.gravitySign === "mirrored") parts.push("accelerometer axis mirrored, refused");
  return `${parts.join(", ")} (${d.from})`;
}
