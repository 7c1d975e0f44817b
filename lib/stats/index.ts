export { jStat } from "./jstat";
export { tInterval, type IntervalSummary } from "./tInterval";
export { pairedT, type PairedTResult } from "./pairedT";
export { holm } from "./holm";
export { leastSquaresLine, type RegressionLine } from "./linearRegression";
export { orthonormalContrasts } from "./orthonormalContrasts";
export { sphericity, type MauchlyResult, type SphericityResult } from "./sphericity";
export { rmAnova, type RmAnovaEffect, type WithinFactor } from "./rmAnova";
export { friedman, type FriedmanResult } from "./friedman";
