export type { Point } from "./point";
export { ringTargets } from "./ringTargets";
export { ringVisitingOrder } from "./ringVisitingOrder";
export { ringAmplitude } from "./ringAmplitude";
export { stripTargets, type StripTarget } from "./stripTargets";
export { nominalIndexOfDifficulty } from "./nominalIndexOfDifficulty";
