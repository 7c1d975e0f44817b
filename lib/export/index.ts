// Anonymised archives: pure pieces (no framework or database imports) and the streamed writer.
export { exportOptionsSchema, type ExportOptions, type ExportOptionsInput } from "./options";
export { stablePseudonym, randomPseudonyms } from "./pseudonyms";
export { kAnonymity, type KAnonymityResult } from "./kAnonymity";
export { coarsenAgeBand, coarsenHandedness, coarsenExperience } from "./coarsen";
export { csvLine } from "./csvLine";
export {
  trialsTableSpec, sequencesTableSpec, cellsTableSpec, conditionsTableSpec, participantsTableSpec, questionnairesTableSpec,
  type FieldSpec, type FieldType, type TableSpec,
} from "./tableSpecs";
export { buildDataPackage, type DataPackageDescriptor } from "./dataPackage";
export { buildCodebook } from "./codebook";
export { buildMethods, type MethodsFacts } from "./methods";
export { participantRows, QUASI_IDENTIFIERS } from "./participantRows";
export { sequenceRows, cellRows, conditionRows } from "./resultRows";
export type { ArchiveSource, ExportParticipant, ExportAnswer, ExportStream, ExportExclusion } from "./source";
export { writeArchive, K_ANONYMITY_THRESHOLD, type ArchiveSummary, type ProgressListener } from "./writeArchive";
export { validateDataPackage, valueMatchesFieldType, dataPackageSchema, TABLE_SCHEMA_TYPES } from "./validateDataPackage";
export { exportHeapLimitMb } from "./heapLimit";
