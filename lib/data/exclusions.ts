import type { Knex } from "knex";
import { z } from "zod";
import { assertCanEditStudy, type SessionUser } from "@/lib/auth/guards";
import type { Queryable } from "@/lib/db";
import { conflict, notFound } from "@/lib/errors";
import type { ResearcherExclusion } from "@/lib/results/buildResultsView";
import { isEventDriven, qualityFlags } from "@/lib/results/qualityFlags";
import { conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";
import { auditAs } from "@/lib/study/service/audit";

const reason = z.string().trim().min(3, "Give the reason, as it will read in the results and the archive.").max(500);

export const exclusionInputSchema = z.discriminatedUnion("scope", [
  z.strictObject({ scope: z.literal("participant"), participantId: z.number().int().positive(), reason }),
  z.strictObject({
    scope: z.literal("sequence"), participantId: z.number().int().positive(), reason,
    conditionIndex: z.number().int().min(0), block: z.number().int().min(1), sequence: z.number().int().min(1),
  }),
]);
export type ExclusionInput = z.input<typeof exclusionInputSchema>;

/** A researcher's exclusion as pages, the analysis and archives read it. */
export interface Exclusion {
  id: number;
  participantId: number;
  /** The participant's code (pages) — an archive replaces it by the pseudonym. */
  participant: string;
  scope: "participant" | "sequence";
  condition: string | null;
  conditionIndex: number | null;
  block: number | null;
  sequence: number | null;
  reason: string;
  /** Measured movements the exclusion removes. */
  movements: number;
  createdAt: Date;
  createdBy: string | null;
  revokedAt: Date | null;
}

type Row = { id: number; participant_id: number; code: string; scope: "participant" | "sequence"; condition_index: number | null; block: number | null; sequence: number | null; reason: string; created_at: Date; creator: string | null; revoked_at: Date | null };

/**
 * The study's exclusions (listExclusions), oldest first; active ones only unless `all`. Each with
 * its condition's label and the measured movements it removes.
 */
export async function listExclusions(q: Queryable, studyId: number, options: { all?: boolean; participantId?: number } = {}): Promise<Exclusion[]> {
  const query = q("exclusions as e").join("participants as p", "p.id", "e.participant_id").leftJoin("users as u", "u.id", "e.created_by")
    .where("e.study_id", studyId).orderBy("e.id")
    .select<Row[]>("e.id", "e.participant_id", "p.code", "e.scope", "e.condition_index", "e.block", "e.sequence", "e.reason", "e.created_at", "u.name as creator", "e.revoked_at");
  if (!options.all) query.whereNull("e.revoked_at");
  if (options.participantId !== undefined) query.andWhere("e.participant_id", options.participantId);
  const rows = await query;
  if (rows.length === 0) return [];
  const counts = await q("trials").whereIn("participant_id", [...new Set(rows.map((r) => r.participant_id))]).where({ practice: false })
    .groupBy("participant_id", "condition_index", "block", "sequence")
    .select<{ participant_id: number; condition_index: number; block: number; sequence: number; condition: string; n: number }[]>("participant_id", "condition_index", "block", "sequence", q.raw("MIN(`condition`) as `condition`"), q.raw("COUNT(*) as n"));
  return rows.map((r) => {
    const mine = counts.filter((c) => c.participant_id === r.participant_id && (r.scope === "participant" || (c.condition_index === r.condition_index && c.block === r.block && c.sequence === r.sequence)));
    return {
      id: r.id, participantId: r.participant_id, participant: r.code, scope: r.scope, conditionIndex: r.condition_index, block: r.block, sequence: r.sequence,
      condition: r.scope === "sequence" ? mine[0]?.condition ?? null : null, reason: r.reason,
      movements: mine.reduce((a, c) => a + Number(c.n), 0), createdAt: r.created_at, createdBy: r.creator, revokedAt: r.revoked_at,
    };
  });
}

/**
 * Excludes a participant or one of their sequences from results and archives, with the reason
 * (editor or owner; audit-logged; reversible with revokeExclusion). The data stay stored: the
 * analysis and archives leave them out and report the exclusion with its reason and counts.
 * @throws 404 no such participant or sequence in the study, 409 already excluded.
 */
export async function addExclusion(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<Exclusion> {
  await assertCanEditStudy(db, user, studyId);
  const v = exclusionInputSchema.parse(input);
  const p = await db("participants").where({ id: v.participantId, study_id: studyId }).first<{ id: number; code: string } | undefined>("id", "code");
  if (!p) throw notFound("No such participant in this study.");
  const active = db("exclusions").where({ study_id: studyId, participant_id: p.id }).whereNull("revoked_at");
  if (await active.clone().where({ scope: "participant" }).first("id")) throw conflict(`${p.code} is already excluded.`);
  const where = v.scope === "sequence" ? { condition_index: v.conditionIndex, block: v.block, sequence: v.sequence } : null;
  if (where) {
    const stored = await db("sequence_streams").where({ participant_id: p.id, practice: false, ...where }).first("id");
    if (!stored) throw notFound("No such measured sequence for this participant.");
    if (await active.clone().where({ scope: "sequence", ...where }).first("id")) throw conflict("This sequence is already excluded.");
  }
  const id = await db.transaction(async (trx) => {
    const [id] = await trx("exclusions").insert({ study_id: studyId, participant_id: p.id, scope: v.scope, ...(where ?? {}), reason: v.reason, created_by: user!.id });
    await auditAs(trx, user!, "exclusion.add", studyId, { exclusionId: Number(id), participant: p.code, scope: v.scope, ...(where ?? {}), reason: v.reason });
    return id;
  });
  return (await listExclusions(db, studyId, { all: true })).find((e) => e.id === Number(id))!;
}

/** Takes an exclusion back (editor or owner; audit-logged); the record stays, marked revoked. */
export async function revokeExclusion(db: Knex, user: SessionUser | null, studyId: number, exclusionId: number): Promise<void> {
  await assertCanEditStudy(db, user, studyId);
  const row = await db("exclusions as e").join("participants as p", "p.id", "e.participant_id").where({ "e.id": exclusionId, "e.study_id": studyId }).first<{ revoked_at: Date | null; code: string; scope: string } | undefined>("e.revoked_at", "p.code", "e.scope");
  if (!row) throw notFound("No such exclusion in this study.");
  if (row.revoked_at) throw conflict("This exclusion was already taken back.");
  await db.transaction(async (trx) => {
    await trx("exclusions").where({ id: exclusionId }).update({ revoked_at: new Date(), revoked_by: user!.id });
    await auditAs(trx, user!, "exclusion.revoke", studyId, { exclusionId, participant: row.code, scope: row.scope });
  });
}

/**
 * One participant's measured sequences with what suggests excluding them (sequenceCandidates):
 * the stream's data-quality figures against the study's minimum rate, samples the runner dropped,
 * and the error rate (lib/results/qualityFlags, the results page's own rules; no rate limit for a
 * condition on a mouse or a touch screen, which report only when used); with any active exclusion
 * of each.
 */
export async function sequenceCandidates(q: Queryable, studyId: number, participantId: number, design: StudyDesign | null): Promise<{
  conditionIndex: number; condition: string; block: number; sequence: number; movements: number; errorRate: number | null; flags: string[]; exclusionId: number | null; reason: string | null;
}[]> {
  const [streams, trials, active] = await Promise.all([
    q("sequence_streams").where({ participant_id: participantId, practice: false }).orderBy(["block", "condition_index", "sequence"])
      .select<{ condition_index: number; condition: string; block: number; sequence: number; quality: unknown; stream_present: number }[]>("condition_index", "condition", "block", "sequence", "quality", q.raw("stream_gz IS NOT NULL as stream_present")),
    q("trials").where({ participant_id: participantId, practice: false }).groupBy("condition_index", "block", "sequence")
      .select<{ condition_index: number; block: number; sequence: number; n: number; miss: number }[]>("condition_index", "block", "sequence", q.raw("COUNT(*) as n"), q.raw("SUM(1 - hit) as miss")),
    q("exclusions").where({ study_id: studyId, participant_id: participantId, scope: "sequence" }).whereNull("revoked_at").select<{ id: number; condition_index: number; block: number; sequence: number; reason: string }[]>("id", "condition_index", "block", "sequence", "reason"),
  ]);
  const minSampleRateHz = design?.minSampleRateHz ?? 0;
  const eventDriven = new Set(design ? conditionsOf(design).filter((c) => isEventDriven(conditionConfig(design, c).technique)).map((c) => c.index) : []);
  return streams.map((s) => {
    const same = (x: { condition_index: number; block: number; sequence: number }) => x.condition_index === s.condition_index && x.block === s.block && x.sequence === s.sequence;
    const t = trials.find(same);
    const e = active.find(same);
    const quality = (typeof s.quality === "string" ? JSON.parse(s.quality) : s.quality) as { sampleRateHz?: number; droppedSamples?: number } | null;
    const errorRate = t && Number(t.n) > 0 ? Number(t.miss) / Number(t.n) : null;
    const flags = qualityFlags(
      { sampleRateHz: quality?.sampleRateHz ?? null, maxGapMs: null, dropped: quality?.droppedSamples ?? 0, hasStream: Boolean(s.stream_present), errorRate, excluded: 0, kept: t ? Number(t.n) : 0, eventDriven: eventDriven.has(s.condition_index) },
      { minSampleRateHz, maxGapMs: 100, maxErrorRate: 0.25 },
    ).filter((f) => f.level === "warning").map((f) => f.text);
    return { conditionIndex: s.condition_index, condition: s.condition, block: s.block, sequence: s.sequence, movements: t ? Number(t.n) : 0, errorRate, flags, exclusionId: e?.id ?? null, reason: e?.reason ?? null };
  });
}

/** The study's active exclusions in the form the analysis and its reports take (ResearcherExclusion), by participant code. */
export async function fetchResearcherExclusions(q: Queryable, studyId: number): Promise<ResearcherExclusion[]> {
  return (await listExclusions(q, studyId)).map((e) => ({ participant: e.participant, scope: e.scope, condition: e.condition, block: e.block, sequence: e.sequence, reason: e.reason, movements: e.movements }));
}
