import type { Queryable } from "@/lib/db";
import type { Study } from "@/lib/data/studies";
import { studyDesignSchema, type StudyDesign } from "../design";
import { protocolChanges, type ProtocolChange, type ProtocolContent } from "../protocolChanges";
import type { ConsentVersionRow, StudyReviewRow } from "./rows";

/** A protocol version: one submission for review, the snapshot of everything it asked to approve. */
export interface ProtocolVersion extends ProtocolContent {
  id: number;
  version: number;
  status: StudyReviewRow["status"];
  designHash: string;
  consentVersionId: number;
  consentVersion: number | null;
  submittedAt: Date;
  decidedAt: Date | null;
}

type VersionRow = StudyReviewRow & {
  version: number | null; title: string | null; summary: string | null; design: unknown; invitation_text: string | null; erasure_window_days: number | null;
  consent_body: string | null; consent_number: number | null;
};

const parseJson = (v: unknown): unknown => (typeof v === "string" ? (JSON.parse(v) as unknown) : v ?? null);

const versionQuery = (q: Queryable) =>
  q("study_reviews as r").leftJoin("consent_versions as c", "c.id", "r.consent_version_id").select("r.*", "c.body_md as consent_body", "c.version as consent_number");

function toVersion(r: VersionRow): ProtocolVersion {
  return {
    id: r.id, version: r.version ?? 0, status: r.status, designHash: r.design_hash, consentVersionId: r.consent_version_id, consentVersion: r.consent_number,
    submittedAt: r.submitted_at, decidedAt: r.decided_at,
    title: r.title ?? "", summary: r.summary ?? "", design: parseJson(r.design), consentBody: r.consent_body, invitationText: r.invitation_text, erasureWindowDays: r.erasure_window_days,
  };
}

/** Every protocol version of a study, newest first. */
export async function listProtocolVersions(q: Queryable, studyId: number): Promise<ProtocolVersion[]> {
  return ((await versionQuery(q).where("r.study_id", studyId).orderBy("r.id", "desc")) as VersionRow[]).map(toVersion);
}

/** The version in force: the newest approved one (participants who start now consent under it), or null. */
export async function fetchInForceVersion(q: Queryable, studyId: number): Promise<ProtocolVersion | null> {
  const r = (await versionQuery(q).where({ "r.study_id": studyId, "r.status": "approved" }).orderBy("r.id", "desc").first()) as VersionRow | undefined;
  return r ? toVersion(r) : null;
}

/** A version by id within its study, or null. */
export async function fetchProtocolVersion(q: Queryable, studyId: number, versionId: number): Promise<ProtocolVersion | null> {
  const r = (await versionQuery(q).where({ "r.study_id": studyId, "r.id": versionId }).first()) as VersionRow | undefined;
  return r ? toVersion(r) : null;
}

/** The submission waiting for a decision, or null. */
export async function fetchOpenReview(q: Queryable, studyId: number): Promise<ProtocolVersion | null> {
  const r = (await versionQuery(q).where({ "r.study_id": studyId, "r.status": "submitted" }).orderBy("r.id", "desc").first()) as VersionRow | undefined;
  return r ? toVersion(r) : null;
}

export type WorkingCopy = ProtocolContent & { design: StudyDesign | null; designHash: string | null; consent: Pick<ConsentVersionRow, "id" | "version" | "status"> | null };

/** What the team edits now: the study's own columns and its newest consent version. */
export async function fetchWorkingCopy(q: Queryable, studyId: number): Promise<WorkingCopy> {
  const s = await q("studies").where({ id: studyId }).first<{ title: string; summary: string; design: unknown; design_hash: string | null; invitation_text: string | null; erasure_window_days: number | null }>(
    "title", "summary", "design", "design_hash", "invitation_text", "erasure_window_days",
  );
  const c = await q<ConsentVersionRow>("consent_versions").where({ study_id: studyId }).orderBy("version", "desc").first("id", "version", "status", "body_md");
  const raw = parseJson(s?.design);
  const parsed = raw ? studyDesignSchema.safeParse(raw) : null;
  return {
    title: s?.title ?? "", summary: s?.summary ?? "", design: parsed?.success ? parsed.data : null, designHash: s?.design_hash ?? null,
    consentBody: c?.body_md ?? null, consent: c ? { id: c.id, version: c.version, status: c.status } : null,
    invitationText: s?.invitation_text ?? null, erasureWindowDays: s?.erasure_window_days ?? null,
  };
}

/** What changed in the working copy since the version in force (empty without one: nothing is approved yet). */
export async function pendingAmendment(q: Queryable, studyId: number): Promise<{ inForce: ProtocolVersion | null; changes: ProtocolChange[] }> {
  const [inForce, working] = await Promise.all([fetchInForceVersion(q, studyId), fetchWorkingCopy(q, studyId)]);
  return { inForce, changes: inForce ? protocolChanges(inForce, working) : [] };
}

/**
 * Why the working copy cannot be edited now, or null when it can: never while a submission waits
 * for a decision (the reviewer must see what they decide on), never once the study is closed
 * (clone it instead). After approval, edits make an amendment; participants keep the approved
 * version until a reviewer approves the amendment.
 */
export async function editLock(q: Queryable, study: Pick<Study, "id" | "status">, what: string): Promise<string | null> {
  if (study.status === "closed") return `The study is closed: its ${what} cannot change. Clone it to run a new version.`;
  if (study.status === "in_review" || (await fetchOpenReview(q, study.id))) return `The protocol is in review: wait for the decision before changing the ${what}.`;
  return null;
}
