import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { assertCanEditStudy, type SessionUser } from "@/lib/auth/guards";
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
  const { study } = await assertCanEditStudy(db, user, studyId);
  const lock = await editLock(db, study, "consent text");
  if (lock) throw conflict(lock);
  const { body, erasureWindowDays } = consentBodySchema.parse(input);
  const latest = await db<ConsentVersionRow>("consent_versions").where({ study_id: studyId }).orderBy("version", "desc").first();
  let id: number;
  const current = await db("studies").where({ id: studyId }).first<{ erasure_window_days: number | null }>("erasure_window_days");
  const windowChanged = erasureWindowDays !== undefined && erasureWindowDays !== (current?.erasure_window_days ?? null);
  if (windowChanged) await db("studies").where({ id: studyId }).update({ erasure_window_days: erasureWindowDays });
  if (latest && latest.status === "draft") {
    await db("consent_versions").where({ id: latest.id }).update({ body_md: body });
    id = latest.id;
  } else {
    if (latest && latest.body_md === body) {
      if (windowChanged) {
        await auditAs(db, user!, "consent.erasure_window", studyId, { erasureWindowDays });
        return toVersion(latest);
      }
      throw conflict(`The text is the same as version ${latest.version}.`);
    }
    const [newId] = await db("consent_versions").insert({ study_id: studyId, version: (latest?.version ?? 0) + 1, body_md: body, status: "draft", created_by: user!.id });
    id = Number(newId);
  }
  await db("studies").where({ id: studyId }).update({ updated_at: db.fn.now(3) });
  const saved = toVersion((await db<ConsentVersionRow>("consent_versions").where({ id }).first())!);
  const inForce = await fetchInForceVersion(db, studyId);
  await auditAs(db, user!, "consent.save", studyId, { version: saved.version, characters: body.length, ...(windowChanged ? { erasureWindowDays } : {}), ...(inForce ? { amendsVersion: inForce.version } : {}) });
  return saved;
}
