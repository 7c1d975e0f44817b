export { twoLevelGainFactor } from "./twoLevelGainFactor";
export { powerGainFactor } from "./powerGainFactor";
export { speedAfterDeadBand } from "./deadBand";
export { fineAimDirectWeight, exponentialSmoothingFactor } from "./fineAimSmoothing";
export { gainAtSpeed, type GainCurveParams } from "./gainAtSpeed";
export { positivePower } from "./positivePower";
