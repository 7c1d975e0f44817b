import type { Knex } from "knex";
import { assertCanViewStudy, requireRole, type SessionUser } from "@/lib/auth/guards";
import { insertStudy } from "@/lib/data/studies";
import { forbidden } from "@/lib/errors";
import { designHash } from "../designHash";
import { auditAs } from "./audit";
import { fetchWorkingCopy } from "./protocol";

/**
 * Clones a study into a new draft (cloneStudy) owned by the researcher who asks (any member of the
 * source's team): title marked as a copy, participant information, design, invitation text,
 * erasure window and the newest consent text as a draft version 1. Nothing of the source's
 * participants, reviews, documents or recruitment settings comes along; the copy needs its own
 * review. Audit-logged on both studies.
 */
export async function cloneStudy(db: Knex, user: SessionUser | null, studyId: number): Promise<{ id: number }> {
  const researcher = requireRole(user, "researcher");
  const { study, teamRole } = await assertCanViewStudy(db, researcher, studyId);
  if (teamRole === null) throw forbidden("Only the study's team can clone it.");
  const working = await fetchWorkingCopy(db, studyId);
  const id = await db.transaction(async (trx) => {
    const id = await insertStudy(trx, { title: `${study.title} (copy)`.slice(0, 200), summary: working.summary, protocolNumber: null, ownerId: researcher.id });
    await trx("studies").where({ id }).update({
      design: working.design ? JSON.stringify(working.design) : null, design_hash: working.design ? designHash(working.design) : null,
      invitation_text: working.invitationText, erasure_window_days: working.erasureWindowDays,
    });
    if (working.consentBody) await trx("consent_versions").insert({ study_id: id, version: 1, body_md: working.consentBody, status: "draft", created_by: researcher.id });
    await auditAs(trx, researcher, "study.clone", studyId, { to: id });
    await auditAs(trx, researcher, "study.create", id, { clonedFrom: studyId, title: `${study.title} (copy)`.slice(0, 200) });
    return id;
  });
  return { id };
}
