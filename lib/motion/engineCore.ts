// The motion-aim engine without validation: only type imports of the configuration schema.
// It composes the stages of ./stages (each a small function of its own state and the sample).
import { clutchCoverages, type InputChannel, type TransferConfig } from "./config";
import type { Vec3 } from "./frames/gravityEstimate";
import type { MotionSample } from "./sample";
import { isValidSample } from "./sampleValidity";
import { biasStep, type BiasParams } from "./stages/bias";
import { controlsParams, controlsStep, createControlsState } from "./stages/controls";
import { displayUnitsStep } from "./stages/displayUnits";
import { deadBandStep } from "./stages/deadBand";
import { clearFineAimSmoothing, createFineAimSmoothingState, fineAimSmoothingStep, type FineAimSmoothingParams } from "./stages/fineAimSmoothing";
import { gainCurveStage, type GainStageParams } from "./stages/gainCurve";
import { createGravityReferenceState, gravityReferenceStep, resetGravityReference, type GravityReferenceParams } from "./stages/gravityReference";
import { createHeadingStickState, headingStickStep, type HeadingStickParams } from "./stages/headingStickChannel";
import { clearLatency, createLatencyState, latencyStep } from "./stages/latency";
import { pointerDeltaStep, pointerPositionStep, type OutputPosition, type PointerChannelParams } from "./stages/pointerChannel";
import { motionViewStep } from "./stages/motionChannel";
import { referenceFrameStage, type ReferenceFrameParams } from "./stages/referenceFrame";
import { createSampleClockState, sampleClockStep } from "./stages/sampleClock";
import { createScreenRotationState, screenRotationStep } from "./stages/screenRotation";
import { stickRateStep, type StickRateParams } from "./stages/stickRateChannel";
import { createTiltReferenceState, resetTiltReference, tiltChannelStep, type TiltChannelParams } from "./stages/tiltChannel";
import { createStageWork, type StageWork } from "./stages/work";

/**
 * One output step. View mode: `dx` = yaw change in degrees, positive to the right; `dy` = pitch
 * change in degrees, positive up. Cursor mode: `dx`, `dy` in CSS px, y down positive (page
 * coordinates). `recentered` is true on the sample where the recenter button was pressed (the
 * output itself never jumps: recenter resets orientation references only); `clutched` is true
 * while the clutch is engaged (the runner flags movements during which either happened).
 */
export interface MotionOutput {
  dx: number;
  dy: number;
  recentered: boolean;
  clutched: boolean;
}

/** The stateful motion-aim engine: one per participant × condition stream. */
export interface MotionEngine {
  readonly config: TransferConfig;
  /**
   * Feed one sample. Returns the output step (the same object every call: copy what you keep),
   * or null when the sample is invalid (NaN, infinite, missing field, time going backwards):
   * such a sample is counted in `dropped` and leaves the state unchanged.
   */
  push(sample: MotionSample): Readonly<MotionOutput> | null;
  /** Samples accepted and dropped so far. */
  readonly accepted: number;
  readonly dropped: number;
  /** Output steps released early because the added-latency queue was full. */
  readonly latencyOverflows: number;
  /** Whether motion input currently moves the view (not clutched, and active). */
  readonly motionActive: boolean;
  /** Copy the current "up" estimate (unit vector, device axes) into `out`. */
  readUp(out: Vec3): void;
  /**
   * The same as pressing the recenter button (from the next sample): a new tilt reference and
   * gravity reference; nothing moves. Prefer the button bit in the samples, so that a recorded
   * stream replays the recenter too.
   */
  recenter(): void;
  /**
   * Where the output has got to, in output units, before added latency (it starts at 0, 0 and
   * adds every step). Absolute pointer positions (`pointerX/Y`, the touch technique in cursor
   * mode) move the cursor from here to the finger: tell the engine where the cursor starts, in
   * the coordinates the pointer positions use. Replay does the same with `--start X,Y`.
   */
  setPosition(x: number, y: number): void;
  /** Back to the state of a new engine. */
  reset(): void;
}

/** Capacity of the added-latency queue (entries): 1000 ms at up to 4 kHz. */
export const LATENCY_QUEUE_CAPACITY = 4096;

/** The engine's hot-path sample check (the same function as `isValidSample`, without the schema module). */
export const sampleIsUsable = isValidSample;

/** Which channels a technique feeds (usesChannel). Cost: O(1). */
export function usesChannel(technique: TransferConfig["technique"], channel: InputChannel): boolean {
  switch (channel) {
    case "motion":
      return technique === "motion" || technique === "motion+stick" || technique === "motion+touch";
    case "tilt":
      return technique === "tilt-rate";
    case "stick":
      return technique === "stick" || technique === "motion+stick";
    case "pointer":
      return technique === "motion+touch" || technique === "mouse" || technique === "touch";
  }
}

/**
 * Create a motion-aim engine from a configuration that is already validated
 * (createMotionEngineFromValid).
 *
 * Purpose: the engine of {@link createMotionEngine} without the validation step, so a browser
 * bundle that receives configurations the server has already validated (and defaulted) does not
 * carry the schema library. Each sample runs through named stages (./stages): clock → controls
 * (clutch, activation, recenter) → bias → gravity reference → screen frame → reference frame →
 * dead band → gain curve → fine-aim smoothing (motion channel); the tilt-rate, stick (rate or
 * heading) and pointer channels by technique; display units; added latency. The clutch
 * suspends the channels `clutchCovers` names; recenter resets the tilt and gravity references
 * after the sample's output. Source: science.md §7–8 (W3C axes; Casiez & Roussel 2011 CD gain).
 * Cost: O(1) per sample, no allocation in `push`.
 * @throws never itself; a configuration that did not pass `parseTransferConfig` gives undefined
 *   behaviour (use {@link createMotionEngine} for unchecked input).
 * @example const e = createMotionEngineFromValid(parseTransferConfig({ gain: 6 })); e.push({ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }); e.push({ tMs: 100, gyroX: 0, gyroY: 30, gyroZ: 0 })?.dx // -18
 */
export function createMotionEngineFromValid(c: TransferConfig): MotionEngine {
  const motionChannel = usesChannel(c.technique, "motion");
  const tiltChannel = usesChannel(c.technique, "tilt");
  const stickChannel = usesChannel(c.technique, "stick");
  const pointerChannel = usesChannel(c.technique, "pointer");
  const headingStick = c.stickMode === "heading";
  const deviceInput = motionChannel || tiltChannel;
  const needUp = tiltChannel || (motionChannel && c.frame !== "device");
  const cursor = c.displayMode === "cursor";
  const covered: readonly InputChannel[] = clutchCoverages[c.clutchCovers];
  const clutchMotion = covered.includes("motion");
  const clutchTilt = covered.includes("tilt");
  const clutchStick = covered.includes("stick");
  const clutchPointer = covered.includes("pointer");
  const verticalSign = c.invertVertical ? -1 : 1;

  const controlsP = controlsParams(c);
  const biasP: BiasParams = { x: c.biasXDegPerS, y: c.biasYDegPerS, z: c.biasZDegPerS };
  const gravityP: GravityReferenceParams = { sign: c.accelerometerInverted ? -1 : 1, timeConstantS: c.gravityFilterTimeMs / 1000 };
  const frameP: ReferenceFrameParams = { axis: c.deviceHorizontalAxis, verticalSign };
  const gainP: GainStageParams = {
    curve: {
      gain: c.gain, gainCurve: c.gainCurve, curveSlowSpeedDegPerS: c.curveSlowSpeedDegPerS, curveFastSpeedDegPerS: c.curveFastSpeedDegPerS,
      curveSlowGainFactor: c.curveSlowGainFactor, curveExponent: c.curveExponent, curveReferenceSpeedDegPerS: c.curveReferenceSpeedDegPerS,
    },
    horizontalMultiplier: c.horizontalGainMultiplier,
    verticalMultiplier: c.verticalGainMultiplier,
  };
  const smoothingP: FineAimSmoothingParams = { timeMs: c.smoothingTimeMs, speedDegPerS: c.smoothingSpeedDegPerS };
  const tiltP: TiltChannelParams = { deadZoneDeg: c.tiltDeadZoneDeg, maxDeg: c.tiltMaxDeg, exponent: c.tiltExponent, maxRateDegPerS: c.tiltMaxRateDegPerS, verticalSign };
  const stickP: StickRateParams = { deadZone: c.stickDeadZone, outerEdge: c.stickOuterEdge, exponent: c.stickExponent, maxRateDegPerS: c.stickMaxRateDegPerS, verticalSign };
  const headingP: HeadingStickParams = { rimThreshold: c.headingRimThreshold, turnTimeMs: c.headingTurnTimeMs };
  const pointerP: PointerChannelParams = { cursor, gain: cursor ? c.pointerCursorGain : c.pointerDegreesPerPixel, verticalSign };
  const clockP = { maxGapMs: c.maxSampleGapMs };
  const deadBandP = { deadBandDegPerS: c.deadBandDegPerS };
  const unitsP = { cursor, pixelsPerDegree: c.pixelsPerDegree };
  const latencyP = { delayMs: c.addedLatencyMs };

  // Every stage takes objects only (the sample, the work record, its state and parameters): a
  // number passed to or returned from a call that is not inlined would be boxed on the heap.
  const work = createStageWork();
  const clock = createSampleClockState();
  const controls = createControlsState();
  const up = createGravityReferenceState();
  const screen = createScreenRotationState();
  const smoothing = createFineAimSmoothingState();
  const tilt = createTiltReferenceState();
  const heading = createHeadingStickState();
  const position: OutputPosition = { x: 0, y: 0 };
  const delay = createLatencyState(LATENCY_QUEUE_CAPACITY);
  const out: MotionOutput = { dx: 0, dy: 0, recentered: false, clutched: false };
  let accepted = 0, dropped = 0, motionOn = true;

  function resetReferences(): void {
    resetTiltReference(tilt);
    resetGravityReference(up);
  }

  // The pipeline: the stages this configuration needs, in order, each taking objects only, in a
  // few groups run from one loop: the device group (bias, gravity reference, screen frame), the
  // motion channel (reference frame → dead band → gain curve → fine-aim smoothing → rate × Δt),
  // then one group per other channel. No group is inlined into push: each is compiled on its own
  // and inlines its stages and their small helpers (a number passed out of a call that is not
  // inlined would be boxed on the heap); a group per stage cost about a fifth more time per sample
  // in the bench (bench:motion), mostly in the indirect calls.
  const gate = { motion: true, tilt: true, stick: true, pointer: true };
  const pipeline: ((work: StageWork, sample: MotionSample) => void)[] = [];
  if (deviceInput) {
    if (needUp) {
      pipeline.push((w, s) => {
        biasStep(w, biasP, s);
        gravityReferenceStep(up, gravityP, w, s);
        screenRotationStep(screen, s, w, up);
      });
    } else {
      pipeline.push((w, s) => {
        biasStep(w, biasP, s);
        screenRotationStep(screen, s, w, up);
      });
    }
  }
  if (motionChannel) {
    const frameStep = referenceFrameStage(c.frame), gainStep = gainCurveStage(c.gainCurve);
    pipeline.push((w) => {
      if (!gate.motion) return clearFineAimSmoothing(smoothing);
      frameStep(w, frameP);
      deadBandStep(w, deadBandP);
      gainStep(w, gainP);
      fineAimSmoothingStep(smoothing, smoothingP, w);
      motionViewStep(w);
    });
  }
  if (tiltChannel) pipeline.push((w) => tiltChannelStep(tilt, tiltP, w, gate.tilt));
  if (stickChannel && headingStick) pipeline.push((w, s) => headingStickStep(heading, headingP, w, s, gate.stick));
  if (stickChannel && !headingStick) pipeline.push((w, s) => gate.stick && stickRateStep(stickP, w, s));
  pipeline.push((w) => displayUnitsStep(w, unitsP));
  if (pointerChannel) pipeline.push((w, s) => gate.pointer && pointerDeltaStep(pointerP, w, s));
  if (pointerChannel && cursor) pipeline.push((w, s) => gate.pointer && pointerPositionStep(w, position, s));
  const stageCount = pipeline.length;

  function push(s: MotionSample): Readonly<MotionOutput> | null {
    if (!sampleIsUsable(s) || !sampleClockStep(clock, clockP, s, work)) {
      dropped++;
      return null;
    }
    accepted++;
    work.viewX = 0;
    work.viewY = 0;
    controlsStep(controls, controlsP, s);
    const clutched = controls.clutched;
    gate.motion = motionOn = controls.aiming && !(clutched && clutchMotion);
    gate.tilt = controls.aiming && !(clutched && clutchTilt);
    gate.stick = !(clutched && clutchStick);
    gate.pointer = !(clutched && clutchPointer);
    for (let i = 0; i < stageCount; i++) (pipeline[i] as (typeof pipeline)[number])(work, s);
    position.x += work.outX;
    position.y += work.outY;
    latencyStep(delay, latencyP, s, work, out);
    out.recentered = controls.recenterPressed;
    out.clutched = clutched;
    if (controls.recenterPressed) resetReferences();
    return out;
  }

  function reset(): void {
    accepted = 0;
    dropped = 0;
    motionOn = true;
    position.x = 0;
    position.y = 0;
    Object.assign(clock, createSampleClockState());
    Object.assign(controls, createControlsState());
    Object.assign(up, createGravityReferenceState());
    Object.assign(screen, createScreenRotationState());
    Object.assign(smoothing, createFineAimSmoothingState());
    Object.assign(tilt, createTiltReferenceState());
    Object.assign(heading, createHeadingStickState());
    Object.assign(work, createStageWork());
    clearLatency(delay);
  }

  return {
    config: c,
    push,
    get accepted() {
      return accepted;
    },
    get dropped() {
      return dropped;
    },
    get latencyOverflows() {
      return delay.overflows;
    },
    get motionActive() {
      return motionOn;
    },
    readUp(target) {
      target.x = up.x;
      target.y = up.y;
      target.z = up.z;
    },
    recenter: resetReferences,
    setPosition(x, y) {
      position.x = x;
      position.y = y;
    },
    reset,
  };
}
