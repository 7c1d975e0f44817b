export { pairedTPower } from "./pairedTPower";
export { clopperPearson } from "./proportionInterval";
export { simulatePower, powerCurveNs, type PowerModel, type PowerPoint } from "./simulatePower";
export { conditionNoise, type ConditionNoise } from "./conditionNoise";
export { powerModelFor, type PowerRequest } from "./powerModel";
export { pilotEstimates, type PilotEstimate } from "./pilotEstimates";
