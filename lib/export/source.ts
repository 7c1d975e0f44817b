import type { StudyDesign } from "../study/design";
import type { RecruitmentCounts } from "./methods";
import type { ResearcherExclusion } from "../results/buildResultsView";
import type { ParticipantCalibration } from "../results/participantCalibration";
import type { TrialRecord } from "../results/trialRecord";
import type { StoredPath } from "./analysisEntries";

/** A participant as the archive sees them (withdrawn participants are never given). */
export interface ExportParticipant {
  id: number;
  status: string;
  cbRow: number | null;
  conditionOrder: string[];
  betweenLevels: Record<string, string>;
  startedAt: Date | null;
  completedAt: Date | null;
  /** Final-questionnaire answers by item id (raw; the writer coarsens them). */
  final: Record<string, string | number | null>;
  /** The protocol version the participant ran (null: none recorded). */
  protocolVersion?: number | null;
  /** Excluded as a whole by the team (their movements are left out; see exclusions). */
  excluded?: boolean;
}

/** One exclusion by the team, for exclusions.csv and the methods text (its movements are not in the source's trials); by participant id, the writer gives the pseudonym. */
export type ExportExclusion = Omit<ResearcherExclusion, "participant"> & { participantId: number };

export interface ExportAnswer {
  participantId: number;
  condition: string;
  itemId: string;
  valueInt: number | null;
  valueText: string | null;
  answeredAt: Date;
}

/** One recorded sequence's raw stream; `read` loads only this one (gzip replay CSV). */
export interface ExportStream {
  participantId: number;
  condition: string;
  conditionIndex: number;
  block: number;
  sequence: number;
  practice: boolean;
  read(): Promise<Buffer | null>;
}

/**
 * Everything an archive is written from. The iterables are pulled as the archive is written, so
 * a source backed by the database (lib/data/exports.ts) or by files (the benchmark) never holds the
 * whole study in memory. They yield participant by participant, in the order `participants` has
 * when they are pulled (writeArchive sorts it by pseudonym first), never in database order.
 */
export interface ArchiveSource {
  study: { id: number; title: string; design: StudyDesign; createdAt: Date };
  consentVersions: { version: number; sha256: string | null; status: string; bodyMd: string }[];
  participants: ExportParticipant[];
  /** Everyone who consented, withdrawn ones included (the methods text); absent for sources without that history. */
  recruitment?: RecruitmentCounts;
  /** The team's exclusions, already honoured by trials() and streams(). */
  exclusions?: ExportExclusion[];
  counts: { trials: number; streams: number };
  /** Non-practice movements of the given participants, grouped by sequence. */
  trials(): AsyncIterable<TrialRecord>;
  answers(): AsyncIterable<ExportAnswer>;
  streams(): AsyncIterable<ExportStream>;
  /** Each participant's calibration (bias, screen scale), for calibration.csv; optional. */
  calibrations?(): Promise<ReadonlyMap<number, ParticipantCalibration>>;
  /** Path accuracy per movement, computed from the streams; optional. */
  paths?(): Promise<StoredPath[]>;
}
