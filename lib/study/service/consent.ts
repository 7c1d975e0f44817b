import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { assertCanEditStudy, type SessionUser } from "@/lib/auth/guards";
import type { Study } from "@/lib/data/studies";
import { consentBodySchema } from "@/lib/consent/schema";
import { conflict } from "@/lib/errors";
import { auditAs } from "./audit";
import { editLock, fetchInForceVersion } from "./protocol";
import type { ConsentVersionRow } from "./rows";

export type ConsentVersion = {
  id: number;
  version: number;
  body: string;
  sha256: string | null;
  status: ConsentVersionRow["status"];
  createdAt: Date;
  submittedAt: Date | null;
  decidedAt: Date | null;
  decisionComment: string | null;
};

const toVersion = (r: ConsentVersionRow): ConsentVersion => ({
  id: r.id,
  version: r.version,
  body: r.body_md,
  sha256: r.sha256,
  status: r.status,
  createdAt: r.created_at,
  submittedAt: r.submitted_at,
  decidedAt: r.decided_at,
  decisionComment: r.decision_comment,
});

/** Every consent version of a study, newest first. */
export async function listConsentVersions(q: Queryable, studyId: number): Promise<ConsentVersion[]> {
  return (await q<ConsentVersionRow>("consent_versions").where({ study_id: studyId }).orderBy("version", "desc")).map(toVersion);
}

/** The newest approved version, or null. */
export async function latestApprovedConsent(q: Queryable, studyId: number): Promise<ConsentVersion | null> {
  const r = await q<ConsentVersionRow>("consent_versions").where({ study_id: studyId, status: "approved" }).orderBy("version", "desc").first();
  return r ? toVersion(r) : null;
}

/**
 * Saves the consent text: edits the open draft version, or starts a new version when the newest
 * one is frozen (submitted, approved or returned). Frozen versions never change. After approval a
 * new version is part of an amendment: participants keep consenting to the approved version until
 * a reviewer approves the amendment. The erasure window (days after the session within which a
 * participant may ask for erasure, as the text states) is saved with the text when given.
 * @throws 401/403/404, 409 while in review or closed (editLock), ZodError (422) for an empty text.
 */
export async function saveConsentDraft(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<ConsentVersion> {
  await assertCanEditStudy(db, user, studyId);
  const { body, erasureWindowDays } = consentBodySchema.parse(input);
  // Under the study's row lock (which submitForReview takes too), the status is read again and
  // only an open draft is written: a text saved while a submission freezes it cannot slip in.
  return db.transaction(async (trx) => {
    const study = await trx("studies").where({ id: studyId }).forUpdate().first<{ id: number; status: Study["status"]; erasure_window_days: number | null }>("id", "status", "erasure_window_days");
    const lock = await editLock(trx, study!, "consent text");
    if (lock) throw conflict(lock);
    // (no lock of its own: the study row lock serialises every writer of the study's consent versions, and a
    // locking read of a study without versions would lock a gap that other studies insert into)
    const latest = await trx<ConsentVersionRow>("consent_versions").where({ study_id: studyId }).orderBy("version", "desc").first();
    let id: number;
    const windowChanged = erasureWindowDays !== undefined && erasureWindowDays !== (study!.erasure_window_days ?? null);
    if (windowChanged) await trx("studies").where({ id: studyId }).update({ erasure_window_days: erasureWindowDays });
    if (latest && latest.status === "draft") {
      const n = await trx("consent_versions").where({ id: latest.id, status: "draft" }).update({ body_md: body });
      if (n !== 1) throw conflict("The consent text was submitted meanwhile; reload to see its state.");
      id = latest.id;
    } else {
      if (latest && latest.body_md === body) {
        if (windowChanged) {
          await auditAs(trx, user!, "consent.erasure_window", studyId, { erasureWindowDays });
          return toVersion(latest);
        }
        throw conflict(`The text is the same as version ${latest.version}.`);
      }
      const [newId] = await trx("consent_versions").insert({ study_id: studyId, version: (latest?.version ?? 0) + 1, body_md: body, status: "draft", created_by: user!.id });
      id = Number(newId);
    }
    await trx("studies").where({ id: studyId }).update({ updated_at: trx.fn.now(3) });
    const saved = toVersion((await trx<ConsentVersionRow>("consent_versions").where({ id }).first())!);
    const inForce = await fetchInForceVersion(trx, studyId);
    await auditAs(trx, user!, "consent.save", studyId, { version: saved.version, characters: body.length, ...(windowChanged ? { erasureWindowDays } : {}), ...(inForce ? { amendsVersion: inForce.version } : {}) });
    return saved;
  });
}
