export { deviceClasses, allowedDeviceClasses, type DeviceClass } from "./deviceClasses";
export { targetFit, VIEW_VERTICAL_FOV_DEG, FIT_MARGIN_PX, type FitResult } from "./targetFit";
export { expectedSessionTime, type SessionTime, type ConditionTime } from "./sessionTime";
export { simulatedSequenceRows, checkParticipant, fittsFallbackMs } from "./simulatedCells";
export { fitReport, type FitReport } from "./fitReport";
