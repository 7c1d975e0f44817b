import { assertCanViewStudy, type SessionUser } from "@/lib/auth/guards";
import type { Queryable } from "@/lib/db";
import type { Study, TeamRole } from "@/lib/data/studies";
import { forbidden } from "@/lib/errors";
import { z } from "zod";
import { studyDesignSchema, type StudyDesign } from "@/lib/study/design";
import type { ParticipantStatus, ResultsParticipant, TrialRecord } from "@/lib/results";

/** Columns of the trials table the analysis reads. */
export const TRIAL_RECORD_COLUMNS = [
  "participant_id", "condition", "block", "sequence", "trial", "amplitude", "width",
  "from_x", "from_y", "to_x", "to_y", "start_x", "start_y", "end_x", "end_y", "time_ms", "hit",
  "timed_out", "recentered", "clutched",
] as const;

const parseJson = (v: unknown): unknown => (typeof v === "string" ? JSON.parse(v) : v);

/** The study's stored design, validated; null when the study has none yet. */
export async function fetchStudyDesign(q: Queryable, studyId: number): Promise<StudyDesign | null> {
  const row = await q("studies").where({ id: studyId }).first<{ design: unknown } | undefined>("design");
  if (!row || row.design === null || row.design === undefined) return null;
  return studyDesignSchema.parse(parseJson(row.design));
}

const betweenLevelsSchema = z.record(z.string(), z.string()).nullable();

/** The study's participants (code, status, counterbalancing row, between-factor levels), in the order they were created. */
export async function fetchResultsParticipants(q: Queryable, studyId: number): Promise<ResultsParticipant[]> {
  const rows = await q("participants")
    .where({ study_id: studyId })
    .orderBy("id")
    .select<{ id: number; code: string; status: ParticipantStatus; cb_row: number | null; between_levels: unknown }[]>("id", "code", "status", "cb_row", "between_levels");
  return rows.map((r) => ({ id: r.id, code: r.code, status: r.status, cbRow: r.cb_row, betweenLevels: betweenLevelsSchema.parse(parseJson(r.between_levels)) ?? {} }));
}

/** Every non-practice movement of the study, grouped by participant and sequence. */
export async function fetchStudyTrialRecords(q: Queryable, studyId: number, participantId?: number): Promise<TrialRecord[]> {
  const query = q("trials as t")
    .join("participants as p", "p.id", "t.participant_id")
    .where("p.study_id", studyId)
    .andWhere("t.practice", false)
    .orderBy(["t.participant_id", "t.condition_index", "t.block", "t.sequence", "t.trial"])
    .select(TRIAL_RECORD_COLUMNS.map((c) => `t.${c}`));
  if (participantId !== undefined) query.andWhere("t.participant_id", participantId);
  return (await query) as TrialRecord[];
}

export type StreamMeta = {
  id: number;
  condition: string;
  conditionIndex: number;
  block: number;
  sequence: number;
  practice: boolean;
  sampleCount: number;
  movementCount: number;
  quality: unknown;
};

/** The stored raw streams of one participant, without their bytes. */
export async function fetchStreamMeta(q: Queryable, participantId: number): Promise<StreamMeta[]> {
  const rows = await q("sequence_streams")
    .where({ participant_id: participantId })
    .orderBy(["condition_index", "block", "sequence", "practice"])
    .select<{ id: number; condition: string; condition_index: number; block: number; sequence: number; practice: number | boolean; sample_count: number; movement_count: number; quality: unknown }[]>(
      "id", "condition", "condition_index", "block", "sequence", "practice", "sample_count", "movement_count", "quality",
    );
  return rows.map((r) => ({
    id: r.id, condition: r.condition, conditionIndex: r.condition_index, block: r.block, sequence: r.sequence, practice: Boolean(r.practice),
    sampleCount: r.sample_count, movementCount: r.movement_count, quality: parseJson(r.quality),
  }));
}

/** One stream's gzip bytes (null when it was not stored). */
export async function fetchStreamBytes(q: Queryable, streamId: number): Promise<Buffer | null> {
  const row = await q("sequence_streams").where({ id: streamId }).first<{ stream_gz: Buffer | null } | undefined>("stream_gz");
  return row?.stream_gz ?? null;
}

/** One participant of the study, or undefined. */
export async function fetchStudyParticipant(q: Queryable, studyId: number, participantId: number): Promise<ResultsParticipant | undefined> {
  const r = await q("participants")
    .where({ study_id: studyId, id: participantId })
    .first<{ id: number; code: string; status: ParticipantStatus; cb_row: number | null; between_levels: unknown } | undefined>("id", "code", "status", "cb_row", "between_levels");
  return r ? { id: r.id, code: r.code, status: r.status, cbRow: r.cb_row, betweenLevels: betweenLevelsSchema.parse(parseJson(r.between_levels)) ?? {} } : undefined;
}

/** The latest rest-calibration bias of a participant (deg/s per axis), as the session stored it; {} when none. */
export async function fetchCalibratedBias(q: Queryable, participantId: number): Promise<{ biasXDegPerS?: number; biasYDegPerS?: number; biasZDegPerS?: number }> {
  const row = await q("calibrations").where({ participant_id: participantId, kind: "bias" }).orderBy("id", "desc").first<{ result: unknown } | undefined>("result");
  const r = (row ? parseJson(row.result) : null) as Record<string, unknown> | null;
  const out: { biasXDegPerS?: number; biasYDegPerS?: number; biasZDegPerS?: number } = {};
  for (const k of ["biasXDegPerS", "biasYDegPerS", "biasZDegPerS"] as const) {
    const v = r?.[k];
    if (typeof v === "number" && Number.isFinite(v) && Math.abs(v) <= 50) out[k] = v;
  }
  return out;
}

/**
 * Team members only (owner, editor, viewer): the results hold trial data, which reviewers do not
 * need (product brief). @throws 401, 403, 404 as the guards.
 */
export async function assertStudyTeam(q: Queryable, user: SessionUser | null, studyId: number): Promise<{ study: Study; teamRole: TeamRole }> {
  const { study, teamRole } = await assertCanViewStudy(q, user, studyId);
  if (teamRole === null) throw forbidden("Only the study's team sees its results.");
  return { study, teamRole };
}
