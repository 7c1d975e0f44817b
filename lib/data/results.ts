import { assertCanViewStudy, type SessionUser } from "@/lib/auth/guards";
import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import type { Study, TeamRole } from "@/lib/data/studies";
import { forbidden } from "@/lib/errors";
import { z } from "zod";
import { studyDesignSchema, type StudyDesign } from "@/lib/study/design";
import type { ParticipantCalibration, ParticipantStatus, ResultsParticipant, TrialRecord } from "@/lib/results";

/** Columns of the trials table the analysis reads. */
export const TRIAL_RECORD_COLUMNS = [
  "participant_id", "condition", "block", "sequence", "trial", "amplitude", "width",
  "from_x", "from_y", "to_x", "to_y", "start_x", "start_y", "end_x", "end_y", "time_ms", "hit",
  "timed_out", "recentered", "clutched",
] as const;

const parseJson = (v: unknown): unknown => (typeof v === "string" ? JSON.parse(v) : v);

/**
 * The design the study's results are analysed with: the protocol version in force (what
 * participants run), else the working copy (a draft piloted before any approval); null when
 * there is none yet.
 */
export async function fetchStudyDesign(q: Queryable, studyId: number): Promise<StudyDesign | null> {
  const version = await q("study_reviews").where({ study_id: studyId, status: "approved" }).whereNotNull("design").orderBy("id", "desc").first<{ design: unknown } | undefined>("design");
  const row = version ?? (await q("studies").where({ id: studyId }).first<{ design: unknown } | undefined>("design"));
  if (!row || row.design === null || row.design === undefined) return null;
  return studyDesignSchema.parse(parseJson(row.design));
}

const betweenLevelsSchema = z.record(z.string(), z.string()).nullable();

/** Restricts a query on participants (alias `p`) to those whose data results and archives use: real ones, and pilots the team included. */
export function whereInAnalysis<Q extends Knex.QueryBuilder>(query: Q, alias = "p"): Q {
  return query.where((w) => w.where(`${alias}.kind`, "real").orWhere(`${alias}.included`, true)) as Q;
}

/** Leaves out movements or streams (alias `t`) that an active exclusion covers: all of their participant's, or their measured sequence's. */
export function whereNotExcluded<Q extends Knex.QueryBuilder>(query: Q, alias = "t"): Q {
  return query.whereNotExists(function () {
    this.select(1).from("exclusions as e")
      .whereRaw(`e.participant_id = ${alias}.participant_id`)
      .whereNull("e.revoked_at")
      .andWhere((w) => w.where("e.scope", "participant").orWhereRaw(`(e.condition_index = ${alias}.condition_index AND e.block = ${alias}.block AND e.sequence = ${alias}.sequence AND ${alias}.practice = 0)`));
  }) as Q;
}

/**
 * The study's participants in results (real ones and included pilots: code, status,
 * counterbalancing row, between-factor levels, protocol version), in the order they were created.
 */
export async function fetchResultsParticipants(q: Queryable, studyId: number): Promise<ResultsParticipant[]> {
  const rows = await whereInAnalysis(q("participants as p").where("p.study_id", studyId)).leftJoin("study_reviews as v", "v.id", "p.protocol_version_id").orderBy("p.id")
    .select<{ id: number; code: string; status: ParticipantStatus; cb_row: number | null; between_levels: unknown; kind: "real" | "pilot" | "simulated"; version: number | null }[]>(
      "p.id", "p.code", "p.status", "p.cb_row", "p.between_levels", "p.kind", "v.version as version",
    );
  return rows.map((r) => ({ id: r.id, code: r.code, status: r.status, cbRow: r.cb_row, betweenLevels: betweenLevelsSchema.parse(parseJson(r.between_levels)) ?? {}, kind: r.kind, protocolVersion: r.version }));
}

/**
 * Every non-practice movement of the study that results use (real participants and included
 * pilots, exclusions honoured), grouped by participant and sequence. For one participant (their
 * detail page) every movement, excluded ones too, so the team can see what it left out.
 */
export async function fetchStudyTrialRecords(q: Queryable, studyId: number, participantId?: number): Promise<TrialRecord[]> {
  const query = q("trials as t")
    .join("participants as p", "p.id", "t.participant_id")
    .where("p.study_id", studyId)
    .andWhere("t.practice", false)
    .orderBy(["t.participant_id", "t.condition_index", "t.block", "t.sequence", "t.trial"])
    .select(TRIAL_RECORD_COLUMNS.map((c) => `t.${c}`));
  if (participantId !== undefined) query.andWhere("t.participant_id", participantId);
  else whereNotExcluded(whereInAnalysis(query));
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

/** Each participant's latest calibration of each kind (bias, card, blind spot), for replaying their streams. */
export async function fetchCalibrations(q: Queryable, participantIds: readonly number[]): Promise<Map<number, ParticipantCalibration>> {
  const out = new Map<number, ParticipantCalibration>();
  if (participantIds.length === 0) return out;
  const rows = await q("calibrations")
    .whereIn("participant_id", participantIds)
    .whereIn("kind", ["bias", "card", "blind_spot"])
    .orderBy("id", "asc")
    .select<{ participant_id: number; kind: string; result: unknown }[]>("participant_id", "kind", "result");
  for (const row of rows) {
    const cal = out.get(row.participant_id) ?? { bias: {}, pixelsPerMm: null, viewingDistanceMm: null };
    const r = (parseJson(row.result) ?? {}) as Record<string, unknown>;
    const num = (k: string, max: number) => (typeof r[k] === "number" && Number.isFinite(r[k]) && Math.abs(r[k] as number) <= max ? (r[k] as number) : undefined);
    if (row.kind === "bias") {
      cal.bias = {};
      for (const k of ["biasXDegPerS", "biasYDegPerS", "biasZDegPerS"] as const) {
        const v = num(k, 50);
        if (v !== undefined) cal.bias[k] = v;
      }
    }
    if (row.kind === "card") cal.pixelsPerMm = num("pixelsPerMm", 100) ?? null;
    if (row.kind === "blind_spot") cal.viewingDistanceMm = num("viewingDistanceMm", 5000) ?? null;
    out.set(row.participant_id, cal);
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
