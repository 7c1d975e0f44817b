// Results of a study: pure pieces the results API and the archive share (no framework or database imports).
export { analysisUnitOf, geometryOf } from "./analysisUnit";
export { trialRowFromRecord, type TrialRecord } from "./trialRecord";
export { awMeans, type AwMean } from "./awMeans";
export { learningCurve, type LearningPoint } from "./learningCurve";
export { endpointScatter, type EndpointCloud, type MisfireReasons } from "./endpointScatter";
export { progressCounts, PARTICIPANT_STATUSES, type ParticipantStatus, type ProgressCounts } from "./progressCounts";
export { replayTrajectory, type Trajectory } from "./replayTrajectory";
export { replayPositions, type ReplayedPositions, type ReplaySetup } from "./replayPositions";
export { replaySetupFor, NO_CALIBRATION, type ParticipantCalibration } from "./participantCalibration";
export { sequencePathMeasures, type PathOptions, type RecordedMovement as PathMovement, type SequencePaths } from "./sequencePathMeasures";
export { isEventDriven, qualityFlags, type QualityFlag, type QualityThresholds } from "./qualityFlags";
export { buildResultsView, type ResultsView, type ResultsParticipant, type ResultsOptions, type ResearcherExclusion, type PathStatus } from "./buildResultsView";
export { participantView, type ParticipantView, type ParticipantSequenceView, type ParticipantStream } from "./participantView";
export { streamPaths, pathMovementsOf, PATH_METHOD_VERSION } from "./streamPaths";
