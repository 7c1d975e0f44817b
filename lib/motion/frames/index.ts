export { screenFrameX, screenFrameY } from "./screenFrame";
export { deviceFrameHorizontal } from "./deviceFrame";
export { gravityFrameHorizontal, gravityFrameVertical } from "./gravityFrame";
export { adaptiveFrameHorizontal } from "./adaptiveFrame";
export { updateGravityEstimate, type AccelerationFields, type RotationStep, type Vec3 } from "./gravityEstimate";
