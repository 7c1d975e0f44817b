import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { conflict, notFound, AppError, unprocessable } from "@/lib/errors";
import { hashToken } from "@/lib/auth/tokens";
import { appendAudit } from "@/lib/data/audit";
import { studyDesignSchema, conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";
import { betweenLevelsFor, orderForParticipant } from "@/lib/study/counterbalance";
import {
  deviceSummary, initialProgress, planSeedFor, planSession, progressSchema, qualityFlags, requiredStatementIds,
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

/** The withdrawn status answers uploads with 410 Gone: the session accepts no more data. */
export const withdrawnError = () => new AppError(410, "withdrawn", "This session was withdrawn; no more data is accepted.");

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

/** Refuses any write to a withdrawn or finished session. */
export function assertWritable(ctx: SessionContext): void {
  if (ctx.participant.status === "withdrawn") throw withdrawnError();
  if (ctx.participant.status === "completed") throw conflict("This session is complete.");
}

/** Refuses a step that needs consent first. */
export function assertConsented(ctx: SessionContext): void {
  assertWritable(ctx);
  if (ctx.participant.status === "invited") throw conflict("Consent comes first.");
}

/**
 * Records consent: checks the version is the approved one (by id and hash), every required
 * statement is ticked and the typed name is there when the study asks for it; stores the record
 * with server time and a coarse device summary; assigns the counterbalanced condition order
 * (the participant's index = how many consented before, under a lock on the study row) and the
 * between-subject levels (the same index, in rotation). Returns the order's labels.
 */
export async function recordConsent(db: Knex, ctx: SessionContext, input: ConsentRequest, userAgent: string | null): Promise<{ signedAt: Date; version: number; body: string; hash: string; order: string[] }> {
  assertWritable(ctx);
  if (ctx.participant.status !== "invited") throw conflict("Consent is already recorded for this session.");
  if (ctx.study.status !== "recruiting") throw conflict("This study is not recruiting at the moment.");
  const version = await fetchApprovedConsent(db, ctx.study.id);
  if (!version) throw conflict("This study has no approved consent document yet.");
  if (version.id !== input.consentVersionId || version.sha256 !== input.versionHash) throw conflict("The consent document has changed; please read the current version.");
  const missing = requiredStatementIds(version.body_md).filter((id) => !input.agreed.includes(id));
  if (missing.length > 0) throw unprocessable(`Every statement must be ticked (missing: ${missing.join(", ")}).`);
  if (ctx.design.requireTypedName && !(input.typedName && input.typedName.length >= 2)) throw unprocessable("Type your name to sign.");
  const signedAt = new Date();
  const conditions = conditionsOf(ctx.design);
  const labels = await db.transaction(async (trx) => {
    await trx("studies").where({ id: ctx.study.id }).forUpdate().first("id");
    const current = await trx<ParticipantRow>("participants").where({ id: ctx.participant.id }).forUpdate().first();
    if (!current || current.status !== "invited") throw conflict("Consent is already recorded for this session.");
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
      typed_name: ctx.design.requireTypedName ? input.typedName ?? null : null,
      signed_at: signedAt,
      device_summary: JSON.stringify(deviceSummary(userAgent, input.screenShortSidePx)),
    });
    await trx("participants").where({ id: ctx.participant.id }).update({
      status: "consented",
      cb_row: row,
      condition_order: JSON.stringify(orderLabels),
      between_levels: JSON.stringify(between),
      consented_at: signedAt,
      last_activity_at: signedAt,
      progress: JSON.stringify({ ...initialProgress(), stage: "device" } satisfies Progress),
    });
    return orderLabels;
  });
  await appendAudit(db, { actorUserId: null, actorLabel: `participant ${ctx.participant.code}`, action: "participant.consented", studyId: ctx.study.id, details: { participant: ctx.participant.code, consentVersion: version.version, versionHash: version.sha256 } });
  return { signedAt, version: version.version, body: version.body_md, hash: version.sha256!, order: labels };
}

/** Stores the device check (coarse: input types, sensor rate, jitter; nothing identifying). */
export async function saveDeviceCheck(q: Queryable, ctx: SessionContext, input: DeviceRequest): Promise<void> {
  assertConsented(ctx);
  const device = { inputs: input.inputs, sampleRateHz: input.sampleRateHz, jitterSdMs: input.jitterSdMs, sourceKind: input.sourceKind, verdict: input.verdict };
  await q("participants").where({ id: ctx.participant.id }).update({ device: JSON.stringify(device), last_activity_at: new Date() });
  await q("calibrations").insert({ participant_id: ctx.participant.id, kind: "device_check", result: JSON.stringify(device) });
}

/** Stores one calibration result (bias at rest, card scale, blind-spot distance). */
export async function saveCalibration(q: Queryable, ctx: SessionContext, input: CalibrationRequest): Promise<void> {
  assertConsented(ctx);
  const { kind, ...result } = input;
  await q("calibrations").insert({ participant_id: ctx.participant.id, kind, result: JSON.stringify(result) });
  await q("participants").where({ id: ctx.participant.id }).update({ last_activity_at: new Date() });
}

/** Stores the runner's resumable progress (only forwards: a stale tab cannot move it back). */
export async function saveProgress(q: Queryable, ctx: SessionContext, progress: Progress): Promise<void> {
  assertConsented(ctx);
  const stored = progressSchema.safeParse(jsonColumn(ctx.participant.progress));
  if (stored.success && stored.data.done > progress.done) return;
  const update: Record<string, unknown> = { progress: JSON.stringify(progress), last_activity_at: new Date() };
  if (progress.stage === "task" && ctx.participant.status === "consented") {
    update.status = "in_progress";
    update.started_at = new Date();
  }
  await q("participants").where({ id: ctx.participant.id }).update(update);
}

/** Stores questionnaire answers (a repeat overwrites: the last answer counts). */
export async function saveAnswers(q: Queryable, ctx: SessionContext, input: QuestionnaireRequest): Promise<void> {
  assertConsented(ctx);
  const known = input.condition === "" || conditionsOf(ctx.design).some((c) => c.label === input.condition);
  if (!known) throw unprocessable(`Unknown condition "${input.condition}".`);
  const rows = input.answers.map((a) => ({ participant_id: ctx.participant.id, condition: input.condition, item_id: a.itemId, value_int: a.valueInt, value_text: a.valueText }));
  await q("questionnaire_answers").insert(rows).onConflict(["participant_id", "condition", "item_id"]).merge(["value_int", "value_text", "answered_at"]);
  await q("participants").where({ id: ctx.participant.id }).update({ last_activity_at: new Date() });
}

/**
 * Withdraws the participant: no more data is accepted; the study's rule decides whether the
 * data recorded so far is erased (trials, streams, calibrations, answers). The consent record
 * stays in the register, marked withdrawn. Audit-logged either way.
 */
export async function withdrawParticipant(db: Knex, ctx: SessionContext, reason?: string): Promise<{ erased: boolean }> {
  if (ctx.participant.status === "withdrawn") return { erased: ctx.design.eraseOnWithdrawal };
  const erase = ctx.design.eraseOnWithdrawal;
  const now = new Date();
  const counts = await db.transaction(async (trx) => {
    await trx("participants").where({ id: ctx.participant.id }).forUpdate().first("id");
    const pid = ctx.participant.id;
    let trials = 0, streams = 0;
    if (erase) {
      trials = await trx("trials").where({ participant_id: pid }).delete();
      streams = await trx("sequence_streams").where({ participant_id: pid }).delete();
      await trx("calibrations").where({ participant_id: pid }).delete();
      await trx("questionnaire_answers").where({ participant_id: pid }).delete();
    }
    await trx("consent_records").where({ participant_id: pid }).update({ withdrawn_at: now });
    await trx("participants").where({ id: pid }).update({ status: "withdrawn", withdrawn_at: now, last_activity_at: now, ...(erase ? { device: null, progress: null } : {}) });
    return { trials, streams };
  });
  await appendAudit(db, {
    actorUserId: null, actorLabel: `participant ${ctx.participant.code}`, action: "participant.withdrawn", studyId: ctx.study.id,
    details: { participant: ctx.participant.code, erased: erase, trialsErased: counts.trials, streamsErased: counts.streams, ...(reason ? { reason } : {}) },
  });
  return { erased: erase };
}

/**
 * Completes the session once every measured sequence of the plan is stored on the server
 * (so no movement can be lost after the code is shown); returns the completion code.
 */
export async function completeSession(db: Knex, ctx: SessionContext): Promise<string> {
  if (ctx.participant.status === "completed" && ctx.participant.completion_code) return ctx.participant.completion_code;
  assertConsented(ctx);
  const plan = planOf(ctx);
  if (!plan) throw conflict("Consent comes first.");
  const rows = await db("sequence_streams").where({ participant_id: ctx.participant.id, practice: false }).count<{ n: number }[]>({ n: "*" });
  const stored = Number(rows[0]?.n ?? 0), planned = plan.filter((s) => !s.practice).length;
  if (stored < planned) throw conflict(`${planned - stored} sequence(s) are still being sent.`);
  if (!ctx.participant.completion_code) throw conflict("This session has no completion code; please contact the research team.");
  const now = new Date();
  await db("participants").where({ id: ctx.participant.id }).update({ status: "completed", completed_at: now, last_activity_at: now, progress: JSON.stringify({ ...(jsonColumn(ctx.participant.progress) as object), stage: "complete" }) });
  await appendAudit(db, { actorUserId: null, actorLabel: `participant ${ctx.participant.code}`, action: "participant.completed", studyId: ctx.study.id, details: { participant: ctx.participant.code } });
  return ctx.participant.completion_code;
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
