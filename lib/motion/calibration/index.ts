export { estimateBiasAtRest, type BiasEstimate, type BiasAtRestOptions } from "./biasAtRest";
export { sampleRateReport, type SampleRateReport } from "./sampleRateReport";
export { checkGyroUnits, type GyroUnitCheck } from "./gyroUnitCheck";
