export { createSeededRandom, type SeededRandom } from "./prng";
export { minimumJerkFraction, fittsMovementTimeMs } from "./minimumJerk";
export { deviceSpeedForOutputSpeed, deviceRatesForViewRate, stickForViewRate, pointerForOutputStep, tiltUpForViewRate } from "./inverseTransfer";
export { splitCoarseFine } from "./channelShare";
export { sensorProfiles, type SensorProfile } from "./sensorProfiles";
export { formatTrialCsv, trialColumns, type TrialRow } from "./trialRow";
export {
  simulateSequence, simulatedSequenceTaskSchema, simulatedParticipantSchema,
  type SimulatedSequenceTask, type SimulatedParticipant, type SimulatedSelection, type SimulatedSequence,
} from "./participant";
