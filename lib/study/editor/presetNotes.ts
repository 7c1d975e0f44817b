import type { PresetName } from "@/lib/motion/presets";

/** A preset as the design form offers it: a plain title and when to use it. */
export interface PresetNote {
  title: string;
  /** One sentence on when to start from it, with the source of any figure (science.md; "common practice" for trade facts). */
  when: string;
}

/**
 * A note for every preset of lib/motion/presets.ts (keyed by its names: TypeScript refuses a
 * preset without one, and the editor's coverage test checks the names at run time).
 */
export const presetNotes: Record<PresetName, PresetNote> = {
  "phone-upright": {
    title: "Phone upright, gentle gain",
    when: "A phone held upright like a window, turning about its screen-up axis at gain 2.5: a first study with people new to motion aiming (gains of 1–3 suit newcomers: common practice).",
  },
  "phone-flat": {
    title: "Phone or tablet flat",
    when: "The device held flat like a tray (on a table or lap), turning about the screen's normal, gain 2.5: when the study asks for a flat hold.",
  },
  "controller-any-hold": {
    title: "Controller, any hold",
    when: "A separate controller with a gyroscope held any way: the adaptive frame takes turning from where gravity points, so flat and upright holds both work (gain 3).",
  },
  "true-vertical": {
    title: "Turning about the true vertical",
    when: "Turning about the vertical found from the accelerometer whatever the hold (gain 3): compare it with device axes when holds differ between people.",
  },
  "fast-with-fine-aim": {
    title: "Fast, with fine aim",
    when: "For experienced players: gain 6, where a 30° device turn gives 180° (6–7 suits experienced players: common practice), with a lower gain and fine-aim smoothing for slow movements so small targets stay reachable (speed-dependent gain: Casiez & Roussel, UIST 2011).",
  },
  "stick-coarse-motion-fine": {
    title: "Stick for large turns, motion for fine aim",
    when: "A controller's stick turns quickly, motion aims finely (gain 1.5): the usual pairing of the two (common practice), to compare with the stick alone.",
  },
  "touch-coarse-motion-fine": {
    title: "Touch drag for large turns, motion for fine aim",
    when: "On a phone without a controller: a drag turns quickly, motion aims finely (gain 1.5).",
  },
  "heading-stick": {
    title: "Heading stick with motion",
    when: "The stick's direction sets the heading at once while motion gives the vertical and fine aim: for studies of turning without rate control.",
  },
  "aim-button-motion": {
    title: "Motion while aiming",
    when: "Motion moves the view only while the aim button is held, like a trigger, so the hand can move freely between targets: compare it with motion that is always on.",
  },
  "stick-only": {
    title: "Stick alone",
    when: "Thumbstick rate control alone, the usual baseline for motion aiming on a controller (an analogue stick reached 1.48 bits/s: Natapov, Castellucci & MacKenzie, GI 2009).",
  },
  "tilt-rate-comparison": {
    title: "Tilt drives a rate",
    when: "Tilt sets a turning speed like a stick: a known poor mapping (tilt velocity control 1.2 vs position control 3.3 bits/s: Teather & MacKenzie, GI 2014), kept as a comparison.",
  },
  "mouse-baseline": {
    title: "Mouse baseline",
    when: "A mouse in cursor mode at gain 1, the familiar reference (3.7–4.9 bits/s across ISO studies: Soukoreff & MacKenzie 2004, from memory).",
  },
};
