import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { AppError, conflict, notFound, unprocessable } from "@/lib/errors";
import { hashToken } from "@/lib/auth/tokens";
import { sha256Text } from "@/lib/consent/sha256Text";
import { appendAudit } from "@/lib/data/audit";
import { eraseParticipantWithin } from "@/lib/data/erasure";
import { deleteExportFiles } from "@/lib/data/exportFiles";
import { lockActiveParticipant, refusalFor, withdrawnError, ACTIVE_STATUSES } from "@/lib/data/participantLock";
import { assertCapRoom } from "@/lib/data/places";
import { openWithDataKey, sealWithDataKey } from "@/lib/recruitment/dataKey";
import { returnAddress } from "@/lib/recruitment/returnAddress";
import { inputDetails, type InputDetails } from "@/lib/runner/inputDetails";
import { studyDesignSchema, conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";
import {
  deviceSummary, initialProgress, planSeedFor, planSession, progressSchema, qualityFlags, requiredStatementIds, uploadKey,
  type CalibrationRequest, type ConsentRequest, type DeviceRequest, type PlannedSequence, type Progress,
  type QuestionnaireRequest, type SessionState,
} from "@/lib/runner";
import { answerProblems } from "@/lib/runner/questionnaire";

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
  kind: "real" | "pilot" | "simulated";
  included: number | boolean;
  pilot_design: unknown;
  protocol_version_id: number | null;
  cb_slot: number | null;
  cb_released_at: Date | null;
  cb_release_reason: "device" | "withdrawn" | "inactive" | null;
  revoked_at: Date | null;
  panel_id_encrypted: string | null;
  panel_id_hmac: string | null;
};

/**
 * A participant's session as the server sees it: the row, the study and the design it runs. A real
 * participant runs the protocol version they consented under (before consent: the version in
 * force), with that version's title and information; a pilot runs the working copy it began with.
 */
export type SessionContext = {
  participant: ParticipantRow;
  study: { id: number; title: string; summary: string; status: string };
  design: StudyDesign;
  /** The protocol version (study_reviews row) the session runs, or null (a pilot, or a study from before versions). */
  protocolVersion: { id: number; version: number; consentVersionId: number } | null;
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
 * Only the token's SHA-256 is compared; the token itself is never stored. One query: the
 * participant, the study, and the protocol version the session runs (the participant's own, else
 * the newest approved one).
 */
export async function fetchSessionByToken(q: Queryable, token: string): Promise<SessionContext | undefined> {
  if (!TOKEN_SHAPE.test(token)) return undefined;
  const row = await q("participants as p")
    .join("studies as s", "s.id", "p.study_id")
    .leftJoin("study_reviews as v", "v.id", q.raw("COALESCE(p.protocol_version_id, (SELECT r.id FROM study_reviews r WHERE r.study_id = p.study_id AND r.status = 'approved' ORDER BY r.id DESC LIMIT 1))"))
    .where("p.token_hash", hashToken(token))
    .first<(ParticipantRow & { s_title: string; s_summary: string; s_status: string; s_design: unknown; v_id: number | null; v_version: number | null; v_consent: number | null; v_title: string | null; v_summary: string | null; v_design: unknown }) | undefined>(
      "p.*", "s.title as s_title", "s.summary as s_summary", "s.status as s_status", "s.design as s_design",
      "v.id as v_id", "v.version as v_version", "v.consent_version_id as v_consent", "v.title as v_title", "v.summary as v_summary", "v.design as v_design",
    );
  if (!row) return undefined;
  const { s_title, s_summary, s_status, s_design, v_id, v_version, v_consent, v_title, v_summary, v_design, ...participant } = row;
  const real = participant.kind === "real";
  const version = real && v_id !== null ? { id: v_id, version: v_version ?? 0, consentVersionId: v_consent! } : null;
  const design = !real ? participant.pilot_design ?? s_design : version && v_design !== null ? v_design : s_design;
  return {
    participant,
    study: { id: participant.study_id, title: (version && v_title) || s_title, summary: version && v_summary !== null ? v_summary : s_summary, status: s_status },
    design: parseDesignCached(design),
    protocolVersion: version,
  };
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

/** The answer to a link whose invitation the team revoked before it was used. */
export const revokedError = () => new AppError(410, "revoked", "This invitation was withdrawn by the research team; the link no longer opens a session.");

/** Like {@link fetchSessionByToken}, but a missing session is a 404 and a revoked invitation a 410. */
export async function requireSession(q: Queryable, token: string): Promise<SessionContext> {
  const ctx = await fetchSessionByToken(q, token);
  if (!ctx) throw notFound("No session for this link.");
  if (ctx.participant.revoked_at) throw revokedError();
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

/**
 * The consent text a session shows and records: the protocol version's own (so a participant keeps
 * the version they consented to); for a study from before versions, the newest approved one; for a
 * pilot, the newest version whatever its status (a draft can be piloted), hashed as it reads now.
 */
export async function consentForSession(q: Queryable, ctx: SessionContext): Promise<ConsentVersionRow | undefined> {
  if (ctx.participant.kind !== "real") {
    const newest = await q<ConsentVersionRow>("consent_versions").where({ study_id: ctx.study.id }).orderBy("version", "desc").first();
    return newest ? { ...newest, sha256: newest.sha256 ?? sha256Text(newest.body_md) } : undefined;
  }
  if (ctx.protocolVersion) return q<ConsentVersionRow>("consent_versions").where({ id: ctx.protocolVersion.consentVersionId }).whereNotNull("sha256").first();
  return fetchApprovedConsent(q, ctx.study.id);
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
  const consent = await consentForSession(q, ctx);
  const cal = await q("calibrations").where({ participant_id: p.id }).orderBy("id", "asc").select<{ kind: string; result: unknown }[]>("kind", "result");
  const device = jsonColumn(p.device) as { gravitySign?: unknown } | null;
  const calibration: SessionState["calibration"] = { pixelsPerMm: null, viewingDistanceMm: null, bias: null, accelerometerInverted: device?.gravitySign === "inverted" };
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
    participantCode: p.code,
    pilot: p.kind !== "real",
    returnTo: await returnAddressesFor(q, ctx),
  };
}

/**
 * The session's return addresses (returnAddressesFor): the study's, with the completion code (once
 * completed) and the panel's participant id filled in; pilots get none (they are not from a panel).
 */
export async function returnAddressesFor(q: Queryable, ctx: SessionContext): Promise<{ complete: string | null; screened: string | null }> {
  if (ctx.participant.kind !== "real") return { complete: null, screened: null };
  const s = await q("studies").where({ id: ctx.study.id }).first<{ return_url_complete: string | null; return_url_screened: string | null } | undefined>("return_url_complete", "return_url_screened");
  const panelId = ctx.participant.panel_id_encrypted ? openWithDataKey(ctx.participant.panel_id_encrypted) : null;
  const code = ctx.participant.status === "completed" ? ctx.participant.completion_code : null;
  return {
    complete: code ? returnAddress(s?.return_url_complete ?? null, { code, panelId }) : null,
    screened: returnAddress(s?.return_url_screened ?? null, { panelId }),
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
 * Records consent: checks the version is the session's own (by id and hash; a real participant's
 * is the protocol version in force, a pilot's the newest text) and that its stored text still
 * hashes to that value, every required statement is ticked and the typed name is there when the
 * study asks for it; stores the record with server time, a coarse device summary and the
 * protocol version, which the participant keeps; audit-logs it in the same transaction. The cap
 * (completed and active participants) is checked under the study row's lock. The condition order
 * is not assigned here: a place is taken when the first task sequence starts (lib/data/places.ts).
 * A pilot leaves no consent record (it is a team member trying the session) and needs no
 * recruiting study.
 */
export async function recordConsent(db: Knex, ctx: SessionContext, input: ConsentRequest, userAgent: string | null): Promise<{ signedAt: Date; version: number; body: string; hash: string; order: null }> {
  assertWritable(ctx);
  if (ctx.participant.status !== "invited") throw conflict("Consent is already recorded for this session.");
  const pilot = ctx.participant.kind !== "real";
  if (!pilot && ctx.study.status !== "recruiting") throw conflict("This study is not recruiting at the moment.");
  const version = await consentForSession(db, ctx);
  if (!version) throw conflict("This study has no approved consent document yet.");
  if (version.id !== input.consentVersionId || version.sha256 !== input.versionHash) throw conflict("The consent document has changed; please read the current version.");
  if (sha256Text(version.body_md) !== version.sha256) throw conflict("The consent document's stored text does not match its approved fingerprint, so consent cannot be recorded; please tell the research team.");
  const missing = requiredStatementIds(version.body_md).filter((id) => !input.agreed.includes(id));
  if (missing.length > 0) throw unprocessable(`Every statement must be ticked (missing: ${missing.join(", ")}).`);
  if (ctx.design.requireTypedName && !(input.typedName && input.typedName.length >= 2)) throw unprocessable("Type your name to sign.");
  const signedAt = new Date();
  await db.transaction(async (trx) => {
    const study = await trx("studies").where({ id: ctx.study.id }).forUpdate().first<{ status: string } | undefined>("status");
    if (!pilot && study?.status !== "recruiting") throw conflict("This study is not recruiting at the moment.");
    const current = await trx<ParticipantRow>("participants").where({ id: ctx.participant.id }).forUpdate().first();
    if (!current || current.status !== "invited") throw current?.status === "withdrawn" ? withdrawnError() : conflict("Consent is already recorded for this session.");
    if (!pilot) {
      await assertCapRoom(trx, ctx.study.id, signedAt, ctx.participant.id);
      await trx("consent_records").insert({
        participant_id: ctx.participant.id,
        consent_version_id: version.id,
        version_hash: version.sha256,
        agreed: JSON.stringify(input.agreed),
        typed_name_encrypted: ctx.design.requireTypedName && input.typedName ? sealWithDataKey(input.typedName) : null,
        signed_at: signedAt,
        device_summary: JSON.stringify(deviceSummary(userAgent, input.screenShortSidePx)),
      });
    }
    await trx("participants").where({ id: ctx.participant.id, status: "invited" }).update({
      status: "consented",
      protocol_version_id: ctx.protocolVersion?.id ?? null,
      consented_at: signedAt,
      last_activity_at: signedAt,
      progress: JSON.stringify({ ...initialProgress(), stage: "device" } satisfies Progress),
    });
    await appendAudit(trx, { actorUserId: null, actorLabel: `participant ${ctx.participant.code}`, action: "participant.consented", studyId: ctx.study.id, details: { participant: ctx.participant.code, consentVersion: version.version, versionHash: version.sha256, ...(ctx.protocolVersion ? { protocolVersion: ctx.protocolVersion.version } : {}), ...(pilot ? { pilot: true } : {}) } });
  });
  return { signedAt, version: version.version, body: version.body_md, hash: version.sha256!, order: null };
}

/**
 * Stores the device check (coarse: input types, sensor rate, jitter; nothing identifying). A
 * refusal screens the participant out: they stop counting toward the cap and release any place
 * they hold; passing a later check takes that back.
 */
export async function saveDeviceCheck(db: Knex, ctx: SessionContext, input: DeviceRequest): Promise<void> {
  assertConsented(ctx);
  const device = {
    inputs: input.inputs, sampleRateHz: input.sampleRateHz, jitterSdMs: input.jitterSdMs, sourceKind: input.sourceKind, verdict: input.verdict,
    // the input paths' details (inputs issue): which APIs, rates, input age, gravity sign
    inputApis: input.inputApis ?? null, requestedRateHz: input.requestedRateHz ?? null, controllerRateHz: input.controllerRateHz ?? null,
    inputAgeMedianMs: input.inputAgeMedianMs ?? null, inputAgeP95Ms: input.inputAgeP95Ms ?? null, gravitySign: input.gravitySign ?? null,
  };
  const now = new Date();
  await db.transaction(async (trx) => {
    await lockActiveParticipant(trx, ctx.participant.id, { device: JSON.stringify(device) }, now);
    if (input.verdict === "refused") await trx("participants").where({ id: ctx.participant.id }).whereNull("cb_released_at").update({ cb_released_at: now, cb_release_reason: "device" });
    else await trx("participants").where({ id: ctx.participant.id, cb_release_reason: "device" }).update({ cb_released_at: null, cb_release_reason: null });
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

/** Stores questionnaire answers to the design's own questions (answerProblems; a repeat overwrites: the last answer counts). */
export async function saveAnswers(db: Knex, ctx: SessionContext, input: QuestionnaireRequest): Promise<void> {
  assertConsented(ctx);
  const problems = answerProblems(ctx.design, input);
  if (problems.length > 0) throw unprocessable(`questionnaire: ${problems[0]!.message}`, problems.map((p) => ({ path: "answers", message: p.message })));
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
      .update({ status: "withdrawn", withdrawn_at: now, last_activity_at: now, withdrawal_reason: erase ? null : reason?.trim() || null, cb_released_at: now, cb_release_reason: "withdrawn" });
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
  id: number;
  code: string;
  kind: ParticipantRow["kind"];
  status: SessionState["status"];
  lastActivityAt: Date | null;
  sequencesStored: number;
  sequencesPlanned: number | null;
  sampleRateHz: number | null;
  biasDegPerS: number | null;
  errorRate: number | null;
  flags: string[];
  /** How the input reached the page (paths, rate, raw pointer, input age): the latest sequence's, else the device check's. */
  inputs: InputDetails | null;
};

/** Sessions of a study for the live monitor, newest activity first, with data-quality flags. */
export async function fetchMonitor(q: Queryable, studyId: number, now = new Date()): Promise<MonitorSession[]> {
  const study = await q("studies").where({ id: studyId }).first<{ design: unknown }>("design");
  const design = studyDesignSchema.safeParse(jsonColumn(study?.design));
  const participants = await q<ParticipantRow>("participants").where({ study_id: studyId }).whereNot({ status: "invited" }).orderBy("last_activity_at", "desc");
  if (participants.length === 0) return [];
  const ids = participants.map((p) => p.id);
  const streams = await q("sequence_streams").whereIn("participant_id", ids).where({ practice: false }).groupBy("participant_id").select<{ participant_id: number; n: number }[]>("participant_id", q.raw("count(*) as n"));
  const latestIds = q("sequence_streams").whereIn("participant_id", ids).groupBy("participant_id").select(q.raw("max(id) as id"));
  const latestQuality = await q("sequence_streams").whereIn("id", latestIds).select<{ participant_id: number; quality: unknown }[]>("participant_id", "quality");
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
    const ctx = design.success ? { participant: p, study: { id: studyId, title: "", summary: "", status: "" }, design: design.data, protocolVersion: null } : null;
    const plan = ctx ? planOf(ctx) : null;
    const figures = {
      id: p.id,
      code: p.code,
      kind: p.kind,
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
    const latest = latestQuality.find((x) => x.participant_id === p.id);
    return { ...figures, flags, inputs: inputDetails(jsonColumn(latest?.quality) as Record<string, unknown> | null, jsonColumn(p.device) as Record<string, unknown> | null) };
  });
}
