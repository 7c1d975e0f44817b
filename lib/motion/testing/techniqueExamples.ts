// Test support: one configuration of every technique that the simulated participant
// (lib/motion/simulate) can take through a ring task, shared by the simulation tests and the
// upload-plausibility tests. The heading stick is paired with motion for the vertical (alone it
// turns only horizontally). Imported by tests only.
import type { TransferConfigInput } from "../config";

export const techniqueExamples: readonly (readonly [name: string, config: TransferConfigInput])[] = [
  ["motion", { technique: "motion", frame: "adaptive", gain: 3 }],
  ["stick (rate)", { technique: "stick" }],
  ["motion+stick (rate)", { technique: "motion+stick", frame: "gravity", gain: 2 }],
  ["motion+stick (heading)", { technique: "motion+stick", stickMode: "heading", frame: "adaptive", gain: 2 }],
  ["motion+touch", { technique: "motion+touch", gain: 1.5, pointerDegreesPerPixel: 0.25 }],
  ["mouse", { technique: "mouse", pointerCursorGain: 1.5 }],
  ["touch", { technique: "touch", pointerDegreesPerPixel: 0.2 }],
  ["tilt-rate", { technique: "tilt-rate", gravityFilterTimeMs: 300 }],
];
