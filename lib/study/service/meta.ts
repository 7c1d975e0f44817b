import type { Knex } from "knex";
import { assertCanEditStudy, assertOwnsStudy, type SessionUser } from "@/lib/auth/guards";
import { fetchStudy, addTeamMember, type Study, type TeamRole } from "@/lib/data/studies";
import { findUserRowByEmail } from "@/lib/data/users";
import { conflict, notFound, unprocessable } from "@/lib/errors";
import { invitationTextSchema, teamMemberSchema, updateStudySchema } from "../schemas";
import { auditAs } from "./audit";
import { editLock, fetchInForceVersion } from "./protocol";

/**
 * Edits title, summary and protocol number (editor or owner). Title and summary are what
 * participants read, so they are part of the protocol: refused while a submission waits for
 * review, and after approval an edit is an amendment (participants keep seeing the approved
 * version's words until a reviewer approves the new ones). The protocol number is the board's
 * reference and may change at any time.
 */
export async function updateStudyMeta(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<Study> {
  const { study } = await assertCanEditStudy(db, user, studyId);
  const v = updateStudySchema.parse(input);
  if (v.title !== study.title || v.summary !== study.summary) {
    const lock = await editLock(db, study, "participant information");
    if (lock) throw conflict(lock);
  }
  const inForce = await fetchInForceVersion(db, studyId);
  await db.transaction(async (trx) => {
    await trx("studies").where({ id: studyId }).update({ title: v.title, summary: v.summary, protocol_number: v.protocolNumber, updated_at: trx.fn.now(3) });
    await auditAs(trx, user!, "study.update", studyId, { title: v.title, protocolNumber: v.protocolNumber, ...(inForce ? { amendsVersion: inForce.version } : {}) });
  });
  return (await fetchStudy(db, studyId))!;
}

/** Saves the working copy of the invitation e-mail's text (editor or owner); part of the protocol, locked like the consent text. */
export async function saveInvitationText(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<{ text: string }> {
  const { study } = await assertCanEditStudy(db, user, studyId);
  const lock = await editLock(db, study, "invitation text");
  if (lock) throw conflict(lock);
  const { text } = invitationTextSchema.parse(input);
  const inForce = await fetchInForceVersion(db, studyId);
  await db.transaction(async (trx) => {
    await trx("studies").where({ id: studyId }).update({ invitation_text: text, updated_at: trx.fn.now(3) });
    await auditAs(trx, user!, "study.invitation_text", studyId, { characters: text.length, ...(inForce ? { amendsVersion: inForce.version } : {}) });
  });
  return { text };
}

export type TeamMember = { userId: number; name: string; email: string; role: TeamRole };

export async function listTeam(db: Knex, studyId: number): Promise<TeamMember[]> {
  const rows = await db("study_members as m").join("users as u", "u.id", "m.user_id").where("m.study_id", studyId).orderBy("m.added_at").select<{ user_id: number; name: string; email: string; role: TeamRole }[]>("m.user_id", "u.name", "u.email", "m.role");
  return rows.map((r) => ({ userId: r.user_id, name: r.name, email: r.email, role: r.role }));
}

/** Adds a researcher to the team as editor or viewer, or changes their role (owner only). */
export async function setTeamMember(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<TeamMember[]> {
  const { study } = await assertOwnsStudy(db, user, studyId);
  const v = teamMemberSchema.parse(input);
  const person = await findUserRowByEmail(db, v.email);
  if (!person || !person.active) throw notFound("No active account has that e-mail address.");
  if (person.role !== "researcher") throw unprocessable("Only researchers can join a study's team; reviewers stay independent of the studies they review.", [{ path: "email", message: "not a researcher" }]);
  if (person.id === study.ownerId) throw conflict("The owner is already on the team.");
  await db.transaction(async (trx) => {
    await addTeamMember(trx, studyId, person.id, v.role);
    await auditAs(trx, user!, "team.set", studyId, { userId: person.id, role: v.role });
  });
  return listTeam(db, studyId);
}
