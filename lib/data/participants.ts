import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { conflict, notFound, unprocessable } from "@/lib/errors";
import { hashToken } from "@/lib/auth/tokens";
import { sha256Text } from "@/lib/consent/sha256Text";
import { appendAudit } from "@/lib/data/audit";
import { eraseParticipantWithin } from "@/lib/data/erasure";
import { deleteExportFiles } from "@/lib/data/exportFiles";
import { sealWithDataKey } from "@/lib/recruitment/dataKey";
import { lockActiveParticipant, refusalFor, withdrawnError, ACTIVE_STATUSES } from "@/lib/data/participantLock";
import { studyDesignSchema, conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";
import { betweenLevelsFor, orderForParticipant } from "@/lib/study/counterbalance";
import {
  deviceSummary, initialProgress, planSeedFor, planSession, progressSchema, qualityFlags, requiredStatementIds, uploadKey,
  type CalibrationRequest, type ConsentRequest, type DeviceRequest, type PlannedSequence, type Progress,
  type QuestionnaireRequest, type SessionState,
} from "@/lib/runner";

/** A participants row as MariaDB returns it (JSON columns arrive as text). */
export type ParticipantRow = {
  id: number;
  study_id: number;
  code: string;
  token_hash: string;
  source: "link" | "email" | "public";
  status: SessionState["status"];
  cb_row: number | null;
  condition_order: unknown;
  between_levels: unknown;
  completion_code: string | null;
  progress: unknown;
  device: unknown;
  created_at: Date;
  consented_at: Date | null;
  started_at: Date | null;
  completed_at: Date | null;
  withdrawn_at: Date | null;
  last_activity_at: Date | null;
};

/** A participant's session as the server sees it: the row, the study and its parsed design. */
export type SessionContext = {
  participant: ParticipantRow;
  study: { id: number; title: string; summary: string; status: string };
  design: StudyDesign;
};

export { withdrawnError } from "@/lib/data/participantLock";

const TOKEN_SHAPE = /^[A-Za-z0-9_-]{16,128}$/;

/** JSON columns come back as text from MariaDB; objects pass through. */
export function jsonColumn(value: unknown): unknown {
  if (typeof value !== "string") return value ?? null;
  try {
    return JSON.parse(value) as unknown;
  } catch {
    return null;
  }
}

/**
 * The session a link token opens, or undefined for an unknown or malformed token.
 * Only the token's SHA-256 is compared; the token itself is never stored.
 */
export async function fetchSessionByToken(q: Queryable, token: string): Promise<SessionContext | undefined> {
  if (!TOKEN_SHAPE.test(token)) return undefined;
  const row = await q("participants as p")
    .join("studies as s", "s.id", "p.study_id")
    .where("p.token_hash", hashToken(token))
    .first<(ParticipantRow & { s_title: string; s_summary: string; s_status: string; s_design: unknown }) | undefined>("p.*", "s.title as s_title", "s.summary as s_summary", "s.status as s_status", "s.design as s_design");
  if (!row) return undefined;
  const { s_title, s_summary, s_status, s_design, ...participant } = row;
  return { participant, study: { id: participant.study_id, title: s_title, summary: s_summary, status: s_status }, design: parseDesignCached(s_design) };
}

const designCache = new Map<string, StudyDesign>();

/** Parses a stored design, remembering the last few by their text (uploads arrive many per second). */
function parseDesignCached(raw: unknown): StudyDesign {
  const text = typeof raw === "string" ? raw : JSON.stringify(raw ?? null);
  const hit = designCache.get(text);
  if (hit) return hit;
  const parsed = studyDesignSchema.safeParse(jsonColumn(text));
  if (!parsed.success) throw conflict("The study's design is incomplete, so the session cannot run yet.");
  if (designCache.size >= 64) designCache.delete(designCache.keys().next().value!);
  designCache.set(text, parsed.data);
  return parsed.data;
}

/** Like {@link fetchSessionByToken}, but a missing session is a 404. */
export async function requireSession(q: Queryable, token: string): Promise<SessionContext> {
  const ctx = await fetchSessionByToken(q, token);
  if (!ctx) throw notFound("No session for this link.");
  return ctx;
}

/** The participant's condition order as indices into conditionsOf(design), or null before consent. */
export function orderOf(ctx: SessionContext): number[] | null {
  const labels = jsonColumn(ctx.participant.condition_order);
  if (!Array.isArray(labels)) return null;
  const conditions = conditionsOf(ctx.design);
  const order = labels.map((l) => conditions.findIndex((c) => c.label === l));
  return order.every((i) => i >= 0) ? order : null;
}

const planCache = new WeakMap<StudyDesign, Map<string, readonly PlannedSequence[]>>();

/**
 * The participant's plan (every sequence in order), or null before consent. Remembered per
 * parsed design (the design cache keeps the object) by participant and stored order, since every
 * upload checks against it.
 */
export function planOf(ctx: SessionContext): readonly PlannedSequence[] | null {
  const key = `${ctx.participant.id}|${typeof ctx.participant.condition_order === "string" ? ctx.participant.condition_order : JSON.stringify(ctx.participant.condition_order ?? null)}`;
  let plans = planCache.get(ctx.design);
  const hit = plans?.get(key);
  if (hit) return hit;
  const order = orderOf(ctx);
  if (!order) return null;
  const plan = Object.freeze(planSession(ctx.design, order, planSeedFor(ctx.design.counterbalancing.seed, ctx.participant.id)));
  if (!plans) planCache.set(ctx.design, (plans = new Map()));
  if (plans.size >= 4096) plans.delete(plans.keys().next().value!);
  plans.set(key, plan);
  return plan;
}

type ConsentVersionRow = { id: number; study_id: number; version: number; body_md: string; sha256: string | null; status: string };

/** The study's newest approved consent version, or undefined. */
export async function fetchApprovedConsent(q: Queryable, studyId: number): Promise<ConsentVersionRow | undefined> {
  return q<ConsentVersionRow>("consent_versions").where({ study_id: studyId, status: "approved" }).whereNotNull("sha256").orderBy("version", "desc").first();
}

const configCache = new WeakMap<StudyDesign, Pick<SessionState, "conditions" | "configs">>();

/** The design's condition labels and merged, validated configurations (once per parsed design). */
function conditionsAndConfigs(design: StudyDesign): Pick<SessionState, "conditions" | "configs"> {
  const hit = configCache.get(design);
  if (hit) return hit;
  const conditions = conditionsOf(design);
  const value = { conditions: conditions.map((c) => c.label), configs: conditions.map((c) => conditionConfig(design, c)) };
  configCache.set(design, value);
  return value;
}

/** Everything the runner needs for this session (GET /api/session/[token]); nothing of other sessions. */
export async function fetchSessionState(q: Queryable, ctx: SessionContext): Promise<SessionState> {
  const p = ctx.participant;
  const consent = await fetchApprovedConsent(q, ctx.study.id);
  const cal = await q("calibrations").where({ participant_id: p.id }).orderBy("id", "asc").select<{ kind: string; result: unknown }[]>("kind", "result");
  const calibration: SessionState["calibration"] = { pixelsPerMm: null, viewingDistanceMm: null, bias: null };
  for (const c of cal) {
    const r = jsonColumn(c.result) as Record<string, number> | null;
    if (!r) continue;
    if (c.kind === "card") calibration.pixelsPerMm = r.pixelsPerMm ?? null;
    if (c.kind === "blind_spot") calibration.viewingDistanceMm = r.viewingDistanceMm ?? null;
    if (c.kind === "bias") calibration.bias = { x: r.biasXDegPerS ?? 0, y: r.biasYDegPerS ?? 0, z: r.biasZDegPerS ?? 0 };
  }
  const uploaded = p.status === "withdrawn" ? [] : (await q("sequence_streams").where({ participant_id: p.id }).select<{ upload_key: string }[]>("upload_key")).map((r) => r.upload_key);
  const stored = progressSchema.safeParse(jsonColumn(p.progress));
  return {
    participantId: p.id,
    status: p.status,
    study: { title: ctx.study.title, summary: ctx.study.summary, compensation: ctx.design.compensation },
    design: ctx.design,
    ...conditionsAndConfigs(ctx.design),
    consent: consent ? { versionId: consent.id, version: consent.version, hash: consent.sha256!, body: consent.body_md } : null,
    order: orderOf(ctx),
    planSeed: planSeedFor(ctx.design.counterbalancing.seed, p.id),
    progress: stored.success ? stored.data : initialProgress(),
    calibration,
    uploaded,
    completionCode: p.status === "completed" ? p.completion_code : null,
  };
}

/**
 * Refuses a write early, from the status read with the request (a cheap answer for the common
 * case). Not the guard: the status may change before the write; every write checks it again under
 * the participant row lock (lockActiveParticipant).
 */
export function assertWritable(ctx: SessionContext): void {
  if (ctx.participant.status === "withdrawn") throw withdrawnError();
  if (ctx.participant.status === "completed") throw conflict("This session is complete.");
}

/** Like assertWritable, for a step that needs consent first. */
export function assertConsented(ctx: SessionContext): void {
  if (!ACTIVE_STATUSES.includes(ctx.participant.status)) throw refusalFor(ctx.participant.status);
}

/**
 * Records consent: checks the version is the approved one (by id and hash) and that its stored
 * text still hashes to that value, every required statement is ticked and the typed name is there
 * when the study asks for it; stores the record with server time and a coarse device summary;
 * assigns the counterbalanced condition order (the participant's index = how many consented
 * before, under a lock on the study row) and the between-subject levels (the same index, in
 * rotation); audit-logs it in the same transaction. Returns the order's labels.
 */
export async function recordConsent(db: Knex, ctx: SessionContext, input: ConsentRequest, userAgent: string | null): Promise<{ signedAt: Date; version: number; body: string; hash: string; order: string[] }> {
  assertWritable(ctx);
  if (ctx.participant.status !== "invited") throw conflict("Consent is already recorded for this session.");
  if (ctx.study.status !== "recruiting") throw conflict("This study is not recruiting at the moment.");
  const version = await fetchApprovedConsent(db, ctx.study.id);
  if (!version) throw conflict("This study has no approved consent document yet.");
  if (version.id !== input.consentVersionId || version.sha256 !== input.versionHash) throw conflict("The consent document has changed; please read the current version.");
  if (sha256Text(version.body_md) !== version.sha256) throw conflict("The consent document's stored text does not match its approved fingerprint, so consent cannot be recorded; please tell the research team.");
  const missing = requiredStatementIds(version.body_md).filter((id) => !input.agreed.includes(id));
  if (missing.length > 0) throw unprocessable(`Every statement must be ticked (missing: ${missing.join(", ")}).`);
  if (ctx.design.requireTypedName && !(input.typedName && input.typedName.length >= 2)) throw unprocessable("Type your name to sign.");
  const signedAt = new Date();
  const conditions = conditionsOf(ctx.design);
  const labels = await db.transaction(async (trx) => {
    const study = await trx("studies").where({ id: ctx.study.id }).forUpdate().first<{ status: string } | undefined>("status");
    if (study?.status !== "recruiting") throw conflict("This study is not recruiting at the moment.");
    const current = await trx<ParticipantRow>("participants").where({ id: ctx.participant.id }).forUpdate().first();
    if (!current || current.status !== "invited") throw current?.status === "withdrawn" ? withdrawnError() : conflict("Consent is already recorded for this session.");
    const before = await trx("participants").where({ study_id: ctx.study.id }).whereNotNull("cb_row").count<{ n: number }[]>({ n: "*" });
    const index = Number(before[0]?.n ?? 0);
    const { row, order } = orderForParticipant(ctx.design, index);
    const orderLabels = order.map((i) => conditions[i]!.label);
    const between = betweenLevelsFor(ctx.design, index);
    await trx("consent_records").insert({
      participant_id: ctx.participant.id,
      consent_version_id: version.id,
      version_hash: version.sha256,
      agreed: JSON.stringify(input.agreed),
      typed_name_encrypted: ctx.design.requireTypedName && input.typedName ? sealWithDataKey(input.typedName) : null,
      signed_at: signedAt,
      device_summary: JSON.stringify(deviceSummary(userAgent, input.screenShortSidePx)),
    });
    await trx("participants").where({ id: ctx.participant.id, status: "invited" }).update({
      status: "consented",
      cb_row: row,
      condition_order: JSON.stringify(orderLabels),
      between_levels: JSON.stringify(between),
      consented_at: signedAt,
      last_activity_at: signedAt,
      progress: JSON.stringify({ ...initialProgress(), stage: "device" } satisfies Progress),
    });
    await appendAudit(trx, { actorUserId: null, actorLabel: `participant ${ctx.participant.code}`, action: "participant.consented", studyId: ctx.study.id, details: { participant: ctx.participant.code, consentVersion: version.version, versionHash: version.sha256 } });
    return orderLabels;
  });
  return { signedAt, version: version.version, body: version.body_md, hash: version.sha256!, order: labels };
}

/** Stores the device check (coarse: input types, sensor rate, jitter; nothing identifying). */
export async function saveDeviceCheck(db: Knex, ctx: SessionContext, input: DeviceRequest): Promise<void> {
  assertConsented(ctx);
  const device = { inputs: input.inputs, sampleRateHz: input.sampleRateHz, jitterSdMs: input.jitterSdMs, sourceKind: input.sourceKind, verdict: input.verdict };
  await db.transaction(async (trx) => {
    await lockActiveParticipant(trx, ctx.participant.id, { device: JSON.stringify(device) });
    await trx("calibrations").insert({ participant_id: ctx.participant.id, kind: "device_check", result: JSON.stringify(device) });
  });
}

/** Stores one calibration result (bias at rest, card scale, blind-spot distance). */
export async function saveCalibration(db: Knex, ctx: SessionContext, input: CalibrationRequest): Promise<void> {
  assertConsented(ctx);
  const { kind, ...result } = input;
  await db.transaction(async (trx) => {
    await lockActiveParticipant(trx, ctx.participant.id);
    await trx("calibrations").insert({ participant_id: ctx.participant.id, kind, result: JSON.stringify(result) });
  });
}

/**
 * Stores the runner's resumable progress, only forwards (a stale tab cannot move it back), and
 * starts the session when the task begins: one UPDATE that locks the row, checks the status and
 * compares the stored progress, so a racing withdrawal or completion is never overwritten.
 */
export async function saveProgress(db: Knex, ctx: SessionContext, progress: Progress): Promise<void> {
  assertConsented(ctx);
  const starts = progress.stage === "task" ? 1 : 0;
  const now = new Date();
  await db.transaction(async (trx) => {
    await lockActiveParticipant(trx, ctx.participant.id, {
      progress: trx.raw("IF(COALESCE(JSON_VALUE(progress, '$.done'), 0) > ?, progress, ?)", [progress.done, JSON.stringify(progress)]),
      started_at: trx.raw("IF(status = 'consented' AND ? = 1, ?, started_at)", [starts, now]),
      status: trx.raw("IF(status = 'consented' AND ? = 1, 'in_progress', status)", [starts]),
    }, now);
  });
}

/** Stores questionnaire answers (a repeat overwrites: the last answer counts). */
export async function saveAnswers(db: Knex, ctx: SessionContext, input: QuestionnaireRequest): Promise<void> {
  assertConsented(ctx);
  const known = input.condition === "" || conditionsOf(ctx.design).some((c) => c.label === input.condition);
  if (!known) throw unprocessable(`Unknown condition "${input.condition}".`);
  const rows = input.answers.map((a) => ({ participant_id: ctx.participant.id, condition: input.condition, item_id: a.itemId, value_int: a.valueInt, value_text: a.valueText }));
  await db.transaction(async (trx) => {
    await lockActiveParticipant(trx, ctx.participant.id);
    await trx("questionnaire_answers").insert(rows).onConflict(["participant_id", "condition", "item_id"]).merge(["value_int", "value_text", "answered_at"]);
  });
}

/**
 * Withdraws the participant: no more data is accepted, mail logged for them is purged, and the
 * study's rule decides whether everything recorded is erased (eraseParticipantWithin, in the same
 * transaction) or kept (the consent record then stays in the register, marked withdrawn, and the
 * participant's reason is kept with the participant, where an erasure can reach it). The audit
 * log records the withdrawal and what was erased, never the reason.
 */
export async function withdrawParticipant(db: Knex, ctx: SessionContext, reason?: string): Promise<{ erased: boolean }> {
  const erase = ctx.design.eraseOnWithdrawal;
  const pid = ctx.participant.id;
  const actor = { userId: null, label: `participant ${ctx.participant.code}` };
  const superseded = await db.transaction(async (trx) => {
    const now = new Date();
    const n = await trx("participants").where({ id: pid }).whereNot({ status: "withdrawn" })
      .update({ status: "withdrawn", withdrawn_at: now, last_activity_at: now, withdrawal_reason: erase ? null : reason?.trim() || null });
    if (n === 0) return [];
    await trx("consent_records").where({ participant_id: pid }).update({ withdrawn_at: now });
    await trx("outgoing_mail").where({ participant_id: pid }).delete();
    await appendAudit(trx, { actorUserId: actor.userId, actorLabel: actor.label, action: "participant.withdrawn", studyId: ctx.study.id, details: { participant: ctx.participant.code, erased: erase } });
    if (!erase) return [];
    return (await eraseParticipantWithin(trx, pid, actor, now)).supersededExports;
  });
  await deleteExportFiles(db, superseded);
  return { erased: erase };
}

/**
 * Completes the session once every measured sequence of the plan is stored on the server (so no
 * movement can be lost after the code is shown; each was checked for plausibility when it came);
 * returns the completion code. The status is read under the row lock and written back only if it
 * is still active, so a racing withdrawal stays a withdrawal.
 */
export async function completeSession(db: Knex, ctx: SessionContext): Promise<string> {
  if (ctx.participant.status === "completed" && ctx.participant.completion_code) return ctx.participant.completion_code;
  assertConsented(ctx);
  const plan = planOf(ctx);
  if (!plan) throw conflict("Consent comes first.");
  return db.transaction(async (trx) => {
    const row = await trx("participants").where({ id: ctx.participant.id }).forUpdate()
      .first<{ status: string; completion_code: string | null; progress: unknown } | undefined>("status", "completion_code", "progress");
    if (row?.status === "completed" && row.completion_code) return row.completion_code;
    if (!row || !ACTIVE_STATUSES.includes(row.status as ParticipantRow["status"])) throw refusalFor(row?.status);
    const stored = new Set(await trx("sequence_streams").where({ participant_id: ctx.participant.id, practice: false }).pluck("upload_key"));
    const missing = plan.filter((s) => !s.practice && !stored.has(uploadKey(ctx.participant.id, s))).length;
    if (missing > 0) throw conflict(`${missing} sequence(s) are still being sent.`);
    if (!row.completion_code) throw conflict("This session has no completion code; please contact the research team.");
    const now = new Date();
    const n = await trx("participants").where({ id: ctx.participant.id }).whereIn("status", ACTIVE_STATUSES)
      .update({ status: "completed", completed_at: now, last_activity_at: now, progress: JSON.stringify({ ...(jsonColumn(row.progress) as object), stage: "complete" }) });
    if (n !== 1) throw refusalFor(row.status);
    await appendAudit(trx, { actorUserId: null, actorLabel: `participant ${ctx.participant.code}`, action: "participant.completed", studyId: ctx.study.id, details: { participant: ctx.participant.code } });
    return row.completion_code;
  });
}

/** One row of the live monitor. */
export type MonitorSession = {
  code: string;
  status: SessionState["status"];
  lastActivityAt: Date | null;
  sequencesStored: number;
  sequencesPlanned: number | null;
  sampleRateHz: number | null;
  biasDegPerS: number | null;
  errorRate: number | null;
  flags: string[];
};

/** Sessions of a study for the live monitor, newest activity first, with data-quality flags. */
export async function fetchMonitor(q: Queryable, studyId: number, now = new Date()): Promise<MonitorSession[]> {
  const study = await q("studies").where({ id: studyId }).first<{ design: unknown }>("design");
  const design = studyDesignSchema.safeParse(jsonColumn(study?.design));
  const participants = await q<ParticipantRow>("participants").where({ study_id: studyId }).whereNot({ status: "invited" }).orderBy("last_activity_at", "desc");
  if (participants.length === 0) return [];
  const ids = participants.map((p) => p.id);
  const streams = await q("sequence_streams").whereIn("participant_id", ids).where({ practice: false }).groupBy("participant_id").select<{ participant_id: number; n: number }[]>("participant_id", q.raw("count(*) as n"));
  const errors = await q("trials").whereIn("participant_id", ids).where({ practice: false }).groupBy("participant_id").select<{ participant_id: number; miss: number; n: number }[]>("participant_id", q.raw("sum(1 - hit) as miss"), q.raw("count(*) as n"));
  const biases = await q("calibrations").whereIn("participant_id", ids).where({ kind: "bias" }).orderBy("id", "asc").select<{ participant_id: number; result: unknown }[]>("participant_id", "result");
  const bias = new Map<number, number>();
  for (const b of biases) {
    const r = jsonColumn(b.result) as Record<string, number> | null;
    if (r) bias.set(b.participant_id, Math.hypot(r.biasXDegPerS ?? 0, r.biasYDegPerS ?? 0, r.biasZDegPerS ?? 0));
  }
  return participants.map((p) => {
    const device = jsonColumn(p.device) as { sampleRateHz?: number | null } | null;
    const e = errors.find((x) => x.participant_id === p.id);
    const ctx = design.success ? { participant: p, study: { id: studyId, title: "", summary: "", status: "" }, design: design.data } : null;
    const plan = ctx ? planOf(ctx) : null;
    const figures = {
      code: p.code,
      status: p.status,
      lastActivityAt: p.last_activity_at,
      sequencesStored: Number(streams.find((s) => s.participant_id === p.id)?.n ?? 0),
      sequencesPlanned: plan ? plan.filter((s) => !s.practice).length : null,
      sampleRateHz: device?.sampleRateHz ?? null,
      biasDegPerS: bias.get(p.id) ?? null,
      errorRate: e && Number(e.n) > 0 ? Number(e.miss) / Number(e.n) : null,
    };
    const flags = qualityFlags({
      status: p.status, sampleRateHz: figures.sampleRateHz, minSampleRateHz: design.success ? design.data.minSampleRateHz : 0,
      biasDegPerS: figures.biasDegPerS, errorRate: figures.errorRate, lastActivityMs: p.last_activity_at ? p.last_activity_at.getTime() : null, nowMs: now.getTime(),
    });
    return { ...figures, flags };
  });
}
