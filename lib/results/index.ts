// Results of a study: pure pieces the results API and the archive share (no framework or database imports).
export { analysisUnitOf, geometryOf } from "./analysisUnit";
export { trialRowFromRecord, type TrialRecord } from "./trialRecord";
export { awMeans, type AwMean } from "./awMeans";
export { learningCurve, type LearningPoint } from "./learningCurve";
export { endpointScatter, type EndpointCloud, type MisfireReasons } from "./endpointScatter";
export { progressCounts, PARTICIPANT_STATUSES, type ParticipantStatus, type ProgressCounts } from "./progressCounts";
export { replayTrajectory, type Trajectory } from "./replayTrajectory";
export { qualityFlags, type QualityFlag, type QualityThresholds } from "./qualityFlags";
export { buildResultsView, type ResultsView, type ResultsParticipant, type ResultsOptions, type ResearcherExclusion } from "./buildResultsView";
export { participantView, type ParticipantView, type ParticipantSequenceView, type ParticipantStream } from "./participantView";
