// The motion engine's stages, in the order the engine runs them (engineCore.ts composes them).
export { createStageWork, type StageWork } from "./work";
export { createSampleClockState, sampleClockStep, type SampleClockState } from "./sampleClock";
export { controlsParams, controlsStep, createControlsState, type ControlsParams, type ControlsState } from "./controls";
export { biasStep, type BiasParams } from "./bias";
export { createGravityReferenceState, gravityReferenceStep, resetGravityReference, type GravityReferenceParams, type GravityReferenceState } from "./gravityReference";
export { createScreenRotationState, screenRotationStep, type ScreenRotationState } from "./screenRotation";
export { adaptiveFrameStep, deviceFrameStep, gravityFrameStep, referenceFrameStage, type ReferenceFrameParams, type ReferenceFrameStep } from "./referenceFrame";
export { deadBandStep } from "./deadBand";
export { constantGainStep, gainCurveStage, powerGainStep, twoLevelGainStep, type GainCurveStep, type GainStageParams } from "./gainCurve";
export { motionViewStep } from "./motionChannel";
export { clearFineAimSmoothing, createFineAimSmoothingState, fineAimSmoothingStep, type FineAimSmoothingParams, type FineAimSmoothingState } from "./fineAimSmoothing";
export { createTiltReferenceState, resetTiltReference, tiltChannelStep, type TiltChannelParams, type TiltReferenceState } from "./tiltChannel";
export { stickRateStep, type StickFields, type StickRateParams } from "./stickRateChannel";
export { createHeadingStickState, headingStickStep, type HeadingStickParams, type HeadingStickState } from "./headingStickChannel";
export { displayUnitsStep } from "./displayUnits";
export { pointerDeltaStep, pointerPositionStep, type OutputPosition, type PointerChannelParams, type PointerFields } from "./pointerChannel";
export { clearLatency, createLatencyState, latencyStep, type LatencyState } from "./latency";
