export {
  BETWEEN_PREFIX,
  COORDINATE_COLUMNS,
  FACTOR_PREFIX,
  FLAG_COLUMNS,
  type FlagColumn,
  INTEGER_COLUMNS,
  LEGACY_TRIAL_COLUMNS,
  TRIAL_COLUMNS,
  type TrialColumn,
} from "./columns";
export { legacyTrialRowSchema, trialRowSchema, type LegacyTrialRow, type Located, type TrialRow } from "./trialRow";
export { TrialTableError } from "./trialTableError";
export { makeRowReader, type RowReader } from "./rowReader";
export { forEachTrialRow, type TrialTableReadOptions, type TrialTableReadSummary } from "./forEachTrialRow";
export { readTrialTable } from "./readTrialTable";
export { formatTrialRow, toTrialCsv, trialCsvHeader, type TrialCsvExtras } from "./toTrialCsv";
