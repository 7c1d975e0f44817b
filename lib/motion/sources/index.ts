export type { SampleFragment, SampleSource, SourceKind } from "./types";
export { createSampleMixer, type SampleMixer, type MixerClock } from "./mixer";
export { createDeviceMotionSource, requestMotionPermission, currentScreenAngle } from "./deviceMotion";
export { createGenericSensorSource, hasGenericGyroscope, type GenericSensorSource } from "./genericSensor";
export { createGamepadSource, gamepadButtonMask, gamepadConnected, pickGamepad, type GamepadSource } from "./gamepad";
export { createPointerLockSource, type PointerLockSource } from "./pointerLock";
export { createPointerDragSource, createTouchDirectSource, type PointerDragOptions } from "./pointerDrag";
export { createScriptedSource, fragmentFromSample, type ScriptedSourceOptions } from "./scripted";
