// Participant runner: pure logic shared by the browser session, the server and the tests.
export { planSession, planSeedFor, planSequences, type PlannedSequence, type PlanTask } from "./plan";
export { uploadKey } from "./uploadKey";
export { STAGES, initialProgress, currentStep, advanceProgress, progressFraction, type Stage, type Progress, type RunnerStep } from "./progress";
export { sequenceLayout, isInsideTarget, type LayoutSurface, type SequenceLayout } from "./geometry";
export {
  ID1_CARD_WIDTH_MM, ID1_CARD_HEIGHT_MM, BLIND_SPOT_ANGLE_DEG, pixelsPerMmFromCard, viewingDistanceFromBlindSpot,
  visualDegreesToPixels, pixelsPerTaskUnit, trialUnit, type DisplayCalibration,
} from "./calibration";
export { projectDirection, VIEW_VERTICAL_FOV_DEG } from "./perspective";
export { createSequenceRecorder, type SequenceRecorder, type RecordedMovement, type SelectionCause } from "./sequenceRecorder";
export { consentBlocks, requiredStatementIds, consentCopyText, DEFAULT_STATEMENT, type ConsentBlock } from "./consent";
export { sequenceBatchSchema, movementSchema, sequenceQualitySchema, inputApis, type InputApi, type SequenceBatch, type SequenceQuality, type Movement } from "./batch";
export { batchProblems, plannedLayout, MIN_MEDIAN_MOVEMENT_MS, type Problem } from "./plausibility";
export { streamProblems, MAX_SAMPLE_RATE_HZ, type StreamFacts } from "./streamPlausibility";
export { answerProblems } from "./questionnaire";
export { FINAL_CHOICES, MAX_COMMENT_CHARS } from "./finalChoices";
export { inputPathsFor, usesMotion, type InputPaths } from "./inputPaths";
export { controlMasks, controlSet, controlHelp, controllerButtonName, CONTROL_KEYS, type ControlMasks, type ControlSet, type ControlHelp, type ControlContext } from "./controls";
export { layoutFit, FIT_MARGIN_PX, type FitVerdict } from "./fit";
export { createInputAgeLog, type InputAgeLog, type InputAgeSummary } from "./inputAge";
export { inputDetails, describeInputDetails, type InputDetails } from "./inputDetails";
export { deviceVerdict, type DeviceInputs, type DeviceVerdict } from "./deviceCheck";
export { qualityFlags, QUALITY_LIMITS, type SessionFigures } from "./qualityFlags";
export { retryDelayMs, uploadOutcome, type UploadOutcome } from "./upload";
export { deviceSummary, type DeviceSummary } from "./deviceSummary";
export { selectButtonFor } from "./selectButton";
export * from "./requests";
