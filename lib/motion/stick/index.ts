export { stickRateMagnitude } from "./stickRate";
export { stickHeadingDeg, wrapAngleDeg } from "./stickHeading";
export { tiltSidewaysDeg, tiltForwardDeg } from "./tiltAngles";
