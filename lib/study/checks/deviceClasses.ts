import type { Technique } from "@/lib/motion/config";

/**
 * A class of screen a participant may bring. Sizes are our own planning assumptions (from
 * memory of common devices), stated beside the check: the usable CSS-pixel area after browser
 * bars and safe areas, CSS pixels per millimetre, and a usual viewing distance.
 */
export interface DeviceClass {
  id: "phone-portrait" | "phone-landscape" | "tablet" | "laptop";
  label: string;
  widthPx: number;
  heightPx: number;
  pixelsPerMm: number;
  viewingDistanceMm: number;
}

export const deviceClasses: readonly DeviceClass[] = [
  // a 6.1" phone: 390 × 844 CSS px at about 6 CSS px/mm, less status bar, home bar and browser bars
  { id: "phone-portrait", label: "phone, portrait", widthPx: 390, heightPx: 700, pixelsPerMm: 6, viewingDistanceMm: 300 },
  { id: "phone-landscape", label: "phone, landscape", widthPx: 750, heightPx: 340, pixelsPerMm: 6, viewingDistanceMm: 300 },
  // an 11" tablet held landscape: 1180 × 820 CSS px at about 5.2 CSS px/mm
  { id: "tablet", label: "tablet", widthPx: 1180, heightPx: 740, pixelsPerMm: 5.2, viewingDistanceMm: 400 },
  // a 13–14" laptop: 1280–1366 CSS px wide at about 4.5 CSS px/mm, the browser window's content area
  { id: "laptop", label: "laptop", widthPx: 1280, heightPx: 660, pixelsPerMm: 4.5, viewingDistanceMm: 550 },
];

/** Which screens each technique runs on: a hand-held device's own screen, or a computer's with a controller or mouse. */
const classesByTechnique: Record<Technique, DeviceClass["id"][]> = {
  motion: ["phone-portrait", "phone-landscape", "tablet", "laptop"], // a phone or tablet turned, or a controller with a gyroscope in front of a laptop
  "motion+touch": ["phone-portrait", "phone-landscape", "tablet"],
  touch: ["phone-portrait", "phone-landscape", "tablet"],
  "tilt-rate": ["phone-portrait", "phone-landscape", "tablet"],
  stick: ["laptop"],
  "motion+stick": ["laptop"],
  mouse: ["laptop"],
};

/**
 * The device classes a study's techniques allow (allowedDeviceClasses): the union over its
 * conditions, in the order of {@link deviceClasses}. Cost: O(conditions).
 * @throws never.
 * @example allowedDeviceClasses(["mouse"]).map((d) => d.id) // ["laptop"]
 */
export function allowedDeviceClasses(techniques: readonly Technique[]): DeviceClass[] {
  const ids = new Set(techniques.flatMap((t) => classesByTechnique[t]));
  return deviceClasses.filter((d) => ids.has(d.id));
}
