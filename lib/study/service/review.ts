import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { assertCanEditStudy, assertCanViewStudy, requireRole, type SessionUser } from "@/lib/auth/guards";
import { sha256Text } from "@/lib/consent/sha256Text";
import { conflict, forbidden, unprocessable } from "@/lib/errors";
import { decisionSchema } from "../schemas";
import { auditAs } from "./audit";
import { fetchDesign } from "./design";
import type { ConsentVersionRow, StudyReviewRow } from "./rows";

export type StudyReview = {
  id: number;
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
 * Submits the saved design and the newest consent version for ethics review (editor or owner):
 * freezes that version (SHA-256 of its exact text), records the design hash, status → in_review.
 * @throws 409 unless the study is a draft with a saved design and an unsubmitted consent version.
 */
export async function submitForReview(db: Knex, user: SessionUser | null, studyId: number): Promise<StudyReview> {
  const { study } = await assertCanEditStudy(db, user, studyId);
  if (study.status !== "draft") throw conflict(`Only a draft can be submitted; this study is ${study.status.replace("_", " ")}.`);
  const { design, designHash } = await fetchDesign(db, studyId);
  if (!design || !designHash) throw unprocessable("Save a valid design before submitting.", [{ path: "design", message: "no saved design" }]);
  const consent = await db<ConsentVersionRow>("consent_versions").where({ study_id: studyId }).orderBy("version", "desc").first();
  if (!consent) throw unprocessable("Write a consent version before submitting.", [{ path: "consent", message: "no consent version" }]);
  if (consent.status !== "draft") throw conflict(`Consent version ${consent.version} was already ${consent.status}: change the text to start a new version.`);
  const hash = sha256Text(consent.body_md);
  const reviewId = await db.transaction(async (trx) => {
    const n = await trx("studies").where({ id: studyId, status: "draft" }).update({ status: "in_review", updated_at: trx.fn.now(3) });
    if (n !== 1) throw conflict("The study changed meanwhile; reload and try again.");
    await trx("consent_versions").where({ id: consent.id, status: "draft" }).update({ status: "submitted", sha256: hash, submitted_at: trx.fn.now(3) });
    const [id] = await trx("study_reviews").insert({ study_id: studyId, consent_version_id: consent.id, design_hash: designHash, submitted_by: user!.id });
    return Number(id);
  });
  await auditAs(db, user!, "review.submit", studyId, { reviewId, consentVersion: consent.version, consentSha256: hash, designHash });
  return (await listReviews(db, studyId)).find((r) => r.id === reviewId)!;
}

/**
 * A reviewer's decision on the open review: approve (consent version and study approved) or return
 * with a comment (study back to draft; the next text change starts a new version).
 * A reviewer on the study's team, or who submitted it, may not decide on it.
 * @throws 403 for non-reviewers or a reviewer deciding on their own study, 409 when nothing is in review.
 */
export async function decideReview(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<StudyReview> {
  const reviewer = requireRole(user, "reviewer");
  const { study, teamRole } = await assertCanViewStudy(db, reviewer, studyId);
  const v = decisionSchema.parse(input);
  const open = await db<StudyReviewRow>("study_reviews").where({ study_id: studyId, status: "submitted" }).orderBy("id", "desc").first();
  if (study.status !== "in_review" || !open) throw conflict("This study has no submission waiting for a decision.");
  if (teamRole !== null || study.ownerId === reviewer.id || open.submitted_by === reviewer.id) throw forbidden("You cannot decide on a study you are part of.");
  const approved = v.decision === "approve";
  await db.transaction(async (trx) => {
    const n = await trx("study_reviews").where({ id: open.id, status: "submitted" }).update({ status: approved ? "approved" : "returned", decided_by: reviewer.id, decided_at: trx.fn.now(3), comment: v.comment || null });
    if (n !== 1) throw conflict("Someone decided on this submission meanwhile.");
    await trx("consent_versions").where({ id: open.consent_version_id }).update({ status: approved ? "approved" : "returned", decided_by: reviewer.id, decided_at: trx.fn.now(3), decision_comment: v.comment || null });
    await trx("studies").where({ id: studyId }).update({ status: approved ? "approved" : "draft", updated_at: trx.fn.now(3) });
  });
  await auditAs(db, reviewer, approved ? "review.approve" : "review.return", studyId, { reviewId: open.id, consentVersionId: open.consent_version_id, designHash: open.design_hash, comment: v.comment });
  return (await listReviews(db, studyId)).find((r) => r.id === open.id)!;
}
