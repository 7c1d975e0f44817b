import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { assertCanEditStudy, assertCanViewStudy, requireRole, type SessionUser } from "@/lib/auth/guards";
import { sha256Text } from "@/lib/consent/sha256Text";
import { fetchTeamRole } from "@/lib/data/studies";
import { conflict, forbidden, unprocessable } from "@/lib/errors";
import { decisionSchema } from "../schemas";
import { protocolChanges } from "../protocolChanges";
import { auditAs } from "./audit";
import { fetchInForceVersion, fetchOpenReview, fetchWorkingCopy } from "./protocol";
import type { ConsentVersionRow, StudyReviewRow } from "./rows";

export type StudyReview = {
  id: number;
  /** The protocol version this submission is. */
  version: number;
  consentVersionId: number;
  consentVersion: number;
  designHash: string;
  status: StudyReviewRow["status"];
  submittedAt: Date;
  submittedBy: string;
  decidedAt: Date | null;
  decidedBy: string | null;
  comment: string | null;
};

/** Every review of a study, newest first. */
export async function listReviews(q: Queryable, studyId: number): Promise<StudyReview[]> {
  const rows = await q("study_reviews as r")
    .join("consent_versions as c", "c.id", "r.consent_version_id")
    .join("users as s", "s.id", "r.submitted_by")
    .leftJoin("users as d", "d.id", "r.decided_by")
    .where("r.study_id", studyId)
    .orderBy("r.id", "desc")
    .select<(StudyReviewRow & { consent_version: number; submitter: string; decider: string | null })[]>("r.*", "c.version as consent_version", "s.name as submitter", "d.name as decider");
  return rows.map((r) => ({
    id: r.id,
    version: r.version ?? 0,
    consentVersionId: r.consent_version_id,
    consentVersion: r.consent_version,
    designHash: r.design_hash,
    status: r.status,
    submittedAt: r.submitted_at,
    submittedBy: r.submitter,
    decidedAt: r.decided_at,
    decidedBy: r.decider,
    comment: r.comment,
  }));
}

/**
 * Submits the working copy for ethics review (editor or owner) as a new protocol version: freezes
 * the newest consent version when it is a draft (SHA-256 of its exact text) and snapshots the
 * participant information, the design, the invitation text and the erasure window.
 * A draft study goes to in_review. An approved, recruiting study submits an amendment: it keeps
 * its status (and keeps recruiting under the version in force) while the amendment is reviewed;
 * the consent version in force may be kept when only other parts changed.
 * @throws 409 while a submission waits, for a closed study, for an amendment that changes
 *   nothing, or a consent version that was returned unchanged; 422 without a design or consent.
 */
export async function submitForReview(db: Knex, user: SessionUser | null, studyId: number): Promise<StudyReview> {
  const { study } = await assertCanEditStudy(db, user, studyId);
  if (study.status === "in_review" || study.status === "closed") throw conflict(`Only a draft or an approved study can be submitted; this study is ${study.status.replace("_", " ")}.`);
  if (await fetchOpenReview(db, studyId)) throw conflict("A submission is already waiting for a decision.");
  const working = await fetchWorkingCopy(db, studyId);
  if (!working.design || !working.designHash) throw unprocessable("Save a valid design before submitting.", [{ path: "design", message: "no saved design" }]);
  const consent = await db<ConsentVersionRow>("consent_versions").where({ study_id: studyId }).orderBy("version", "desc").first();
  if (!consent) throw unprocessable("Write a consent version before submitting.", [{ path: "consent", message: "no consent version" }]);
  const amendment = study.status !== "draft";
  const inForce = amendment ? await fetchInForceVersion(db, studyId) : null;
  if (amendment && inForce && protocolChanges(inForce, working).length === 0) throw conflict(`Nothing changed since the approved version ${inForce.version}: there is nothing to review.`);
  const keepsConsent = amendment && consent.status === "approved";
  if (consent.status !== "draft" && !keepsConsent) throw conflict(`Consent version ${consent.version} was already ${consent.status}: change the text to start a new version.`);
  const { reviewId, version, hash } = await db.transaction(async (trx) => {
    // the study's row lock (saveConsentDraft takes it too) and a conditional status change
    if (!amendment) {
      const n = await trx("studies").where({ id: studyId, status: "draft" }).update({ status: "in_review", updated_at: trx.fn.now(3) });
      if (n !== 1) throw conflict("The study changed meanwhile; reload and try again.");
    } else {
      const n = await trx("studies").where({ id: studyId, status: study.status }).forUpdate().first("id");
      if (!n) throw conflict("The study changed meanwhile; reload and try again.");
      if (await trx("study_reviews").where({ study_id: studyId, status: "submitted" }).first("id")) throw conflict("A submission is already waiting for a decision.");
    }
    // the design snapshot is the one stored now (a save may have come after it was read)
    const stored = await trx("studies").where({ id: studyId }).first<{ design_hash: string | null }>("design_hash");
    if (stored?.design_hash !== working.designHash) throw conflict("The design changed meanwhile; reload and submit again.");
    // the fingerprint is taken of the text as stored at the moment it is frozen, under its row lock
    const locked = await trx<ConsentVersionRow>("consent_versions").where({ id: consent.id }).forUpdate().first();
    const newest = await trx("consent_versions").where({ study_id: studyId }).max<{ v: number }[]>({ v: "version" });
    if (!locked || locked.status !== consent.status || Number(newest[0]?.v) !== consent.version) throw conflict("The consent text changed meanwhile; reload and submit again.");
    const hash = keepsConsent ? locked.sha256! : sha256Text(locked.body_md);
    if (!keepsConsent) {
      const n = await trx("consent_versions").where({ id: consent.id, status: "draft" }).update({ status: "submitted", sha256: hash, submitted_at: trx.fn.now(3) });
      if (n !== 1) throw conflict("The consent text changed meanwhile; reload and submit again.");
    }
    const last = await trx("study_reviews").where({ study_id: studyId }).max<{ v: number | null }[]>({ v: "version" });
    const version = Number(last[0]?.v ?? 0) + 1;
    const [id] = await trx("study_reviews").insert({
      study_id: studyId, consent_version_id: consent.id, design_hash: working.designHash, submitted_by: user!.id, version,
      title: working.title, summary: working.summary, design: JSON.stringify(working.design), invitation_text: working.invitationText, erasure_window_days: working.erasureWindowDays,
    });
    // the entry commits with the submission (last: the audit head's lock after the action's own)
    await auditAs(trx, user!, "review.submit", studyId, { reviewId: Number(id), protocolVersion: version, consentVersion: consent.version, consentSha256: hash, designHash: working.designHash, ...(inForce ? { amendsVersion: inForce.version } : {}) });
    return { reviewId: Number(id), version, hash };
  });
  return (await listReviews(db, studyId)).find((r) => r.id === reviewId)!;
}

/**
 * A reviewer's decision on the open submission: approve (the protocol version and its consent
 * version approved; a study in review becomes approved, an amended one keeps its status and new
 * participants now consent under the new version) or return with a comment (a study in review goes
 * back to draft; an amended one keeps running under the version in force).
 * A reviewer on the study's team, or who submitted it, may not decide on it.
 * @throws 403 for non-reviewers or a reviewer deciding on their own study, 409 when nothing is in review.
 */
export async function decideReview(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<StudyReview> {
  const reviewer = requireRole(user, "reviewer");
  const { study, teamRole } = await assertCanViewStudy(db, reviewer, studyId);
  const v = decisionSchema.parse(input);
  const open = await db<StudyReviewRow>("study_reviews").where({ study_id: studyId, status: "submitted" }).orderBy("id", "desc").first();
  if (!open || study.status === "closed") throw conflict("This study has no submission waiting for a decision.");
  const member = teamRole ?? (await fetchTeamRole(db, studyId, reviewer.id));
  if (member !== null || study.ownerId === reviewer.id || open.submitted_by === reviewer.id) throw forbidden("You cannot decide on a study you are part of.");
  const approved = v.decision === "approve";
  await db.transaction(async (trx) => {
    const n = await trx("study_reviews").where({ id: open.id, status: "submitted" }).update({ status: approved ? "approved" : "returned", decided_by: reviewer.id, decided_at: trx.fn.now(3), comment: v.comment || null });
    if (n !== 1) throw conflict("Someone decided on this submission meanwhile.");
    // an amendment may keep the consent version in force: only a submitted one takes the decision
    await trx("consent_versions").where({ id: open.consent_version_id, status: "submitted" }).update({ status: approved ? "approved" : "returned", decided_by: reviewer.id, decided_at: trx.fn.now(3), decision_comment: v.comment || null });
    if (study.status === "in_review") {
      const m = await trx("studies").where({ id: studyId, status: "in_review" }).update({ status: approved ? "approved" : "draft", updated_at: trx.fn.now(3) });
      if (m !== 1) throw conflict("The study changed meanwhile; reload and decide again.");
    }
    else await trx("studies").where({ id: studyId }).update({ updated_at: trx.fn.now(3) });
    await auditAs(trx, reviewer, approved ? "review.approve" : "review.return", studyId, { reviewId: open.id, protocolVersion: open.version, consentVersionId: open.consent_version_id, designHash: open.design_hash, comment: v.comment });
  });
  return (await listReviews(db, studyId)).find((r) => r.id === open.id)!;
}
