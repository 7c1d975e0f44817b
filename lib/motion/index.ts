// Motion-aim input engine: pure TypeScript, no framework imports; browser adapters under sources/.
export { motionSampleSchema, isValidSample, type MotionSample } from "./sample";
export {
  transferConfigSchema, parseTransferConfig, defaultTransferConfig, TransferConfigError, techniques,
  type TransferConfig, type TransferConfigInput, type Technique,
} from "./config";
export { presets, presetNames, presetConfig, type PresetName } from "./presets";
export { createMotionEngine, LATENCY_QUEUE_CAPACITY, type MotionEngine, type MotionOutput } from "./engine";
export * from "./stages";
export { moveShownPosition, type ShownPosition, type CursorBounds } from "./shownPosition";
export { parseSampleCsv, sampleFromTable, formatSampleCsv, SampleCsvError, sampleColumns, type SampleTable, type SampleColumn } from "./csv";
export * from "./frames";
export * from "./gain";
export * from "./stick";
export * from "./calibration";
export * from "./sources";
export * from "./simulate";
