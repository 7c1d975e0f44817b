export { fieldSpecOf, rangeText, type FieldSpec } from "./schemaFields";
export { configGroups, configFieldCatalogue, configFieldKeys, motionChannel, stickChannel, pointerChannel, tiltChannel, type ConfigFieldEntry, type ConfigGroupId } from "./configFields";
export { configFieldIssues, levelFieldIssues, configIssueText, type ConfigFieldIssue } from "./configIssues";
export { mergedConfigUnchecked, levelContexts, relevantFields, relevantFieldsPerLevel, changesFromBase, formatSetting, type SettingChange, type LevelRelevance } from "./levelSettings";
export { presetNotes, type PresetNote } from "./presetNotes";
export { designFieldLabels } from "./designFields";
