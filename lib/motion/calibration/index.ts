export { estimateBiasAtRest, type BiasEstimate, type BiasAtRestOptions } from "./biasAtRest";
export { sampleRateReport, type SampleRateReport } from "./sampleRateReport";
export { checkGyroUnits, type GyroUnitCheck } from "./gyroUnitCheck";
export { checkGravityPosture, type GravityPosture, type GravityPostureCheck } from "./gravityPostureCheck";
export { checkAccelGyroAxes, type AccelGyroAxesCheck, type MirroredAxis } from "./accelGyroAxesCheck";
export { checkGravitySign, gravityCheckNeeded, type GravitySignCheck } from "./gravitySignCheck";
