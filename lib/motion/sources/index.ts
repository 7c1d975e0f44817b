export type { SampleFragment, SampleSource, SourceKind } from "./types";
export { createSampleMixer, type SampleMixer } from "./mixer";
export { createDeviceMotionSource, requestMotionPermission, currentScreenAngle } from "./deviceMotion";
export { createGenericSensorSource, hasGenericGyroscope } from "./genericSensor";
export { createGamepadSource, gamepadButtonMask } from "./gamepad";
export { createPointerLockSource } from "./pointerLock";
export { createPointerDragSource } from "./pointerDrag";
export { createScriptedSource, fragmentFromSample, type ScriptedSourceOptions } from "./scripted";
