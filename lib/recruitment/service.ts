import type { Knex } from "knex";
import { assertCanEditStudy, assertOwnsStudy, type SessionUser } from "@/lib/auth/guards";
import { newToken, hashToken } from "@/lib/auth/tokens";
import type { Queryable } from "@/lib/db";
import { appendAudit } from "@/lib/data/audit";
import { env } from "@/lib/env";
import { conflict, notFound } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send";
import { fetchDesign } from "@/lib/study/service/design";
import { auditAs } from "@/lib/study/service/audit";
import type { ParticipantListRow, StudyDesignRow, StudyReviewRow, ConsentVersionRow } from "@/lib/study/service/rows";
import { recruitmentSchema, invitationSchema } from "@/lib/study/schemas";
import { designSummary } from "@/lib/study/summary/designSummary";
import { newCompletionCode, newParticipantCode } from "./codes";
import { openWithDataKey, sealWithDataKey } from "./dataKey";
import { invitationMail } from "./invitationMail";

export type ParticipantSource = "link" | "email" | "public";
export type NewParticipant = { id: number; code: string; token: string; link: string; completionCode: string };

/** The participant's session link, /s/<token>, on the configured public address. */
export const sessionLink = (token: string) => `${env.NEXTAUTH_URL.replace(/\/$/, "")}/s/${token}`;
/** The study's public link, /s/public/<token>. */
export const publicLink = (token: string) => `${env.NEXTAUTH_URL.replace(/\/$/, "")}/s/public/${token}`;

/**
 * Why recruitment cannot open, or null when it can: the newest consent version must be approved
 * and the saved design must be the one the approving review saw (same design hash).
 */
export async function recruitmentBlocker(q: Queryable, studyId: number): Promise<string | null> {
  const latestConsent = await q<ConsentVersionRow>("consent_versions").where({ study_id: studyId }).orderBy("version", "desc").first();
  if (!latestConsent || latestConsent.status !== "approved") return "The newest consent version is not approved.";
  const approved = await q<StudyReviewRow>("study_reviews").where({ study_id: studyId, status: "approved", consent_version_id: latestConsent.id }).orderBy("id", "desc").first();
  const { designHash } = await fetchDesign(q, studyId);
  if (!approved || approved.design_hash !== designHash) return "The design changed after approval: submit it for review again.";
  return null;
}

async function countActive(q: Queryable, studyId: number): Promise<number> {
  const r = await q("participants").where({ study_id: studyId }).whereNot({ status: "withdrawn" }).count<{ n: number }[]>({ n: "*" });
  return Number(r[0]?.n ?? 0);
}

async function assertRoom(q: Queryable, studyId: number, adding: number): Promise<void> {
  const row = await q<StudyDesignRow>("studies").where({ id: studyId }).first("participant_cap");
  const cap = row?.participant_cap ?? null;
  if (cap !== null && (await countActive(q, studyId)) + adding > cap) throw conflict(`The participant cap (${cap}) would be exceeded.`);
}

/**
 * Inserts one participant with a fresh 128-bit link token (only its hash is stored), a code
 * unique in the study ("P-XXXXXX", retried on a clash) and a completion code.
 */
export async function insertParticipant(q: Queryable, studyId: number, source: ParticipantSource): Promise<NewParticipant> {
  for (let attempt = 0; ; attempt++) {
    const { token, hash } = newToken(16);
    const code = newParticipantCode();
    const completionCode = newCompletionCode();
    try {
      const [id] = await q("participants").insert({ study_id: studyId, code, token_hash: hash, source, status: "invited", completion_code: completionCode });
      return { id: Number(id), code, token, link: sessionLink(token), completionCode };
    } catch (e) {
      if ((e as { code?: string }).code !== "ER_DUP_ENTRY" || attempt >= 5) throw e;
    }
  }
}

/** Opens recruitment (owner; approved study with nothing changed since), closes it, or changes the cap and public link. */
export async function changeRecruitment(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<{ status: string; publicLink: string | null; participantCap: number | null }> {
  const { study } = await assertOwnsStudy(db, user, studyId);
  const v = recruitmentSchema.parse(input);
  const update: Record<string, unknown> = { updated_at: db.fn.now(3) };
  if (v.participantCap !== undefined) update.participant_cap = v.participantCap;
  if (v.publicLink === true) {
    const has = await db<StudyDesignRow>("studies").where({ id: studyId }).first("public_token_hash");
    if (!has?.public_token_hash) {
      const { token, hash } = newToken(16);
      update.public_token_hash = hash;
      update.public_token_encrypted = sealWithDataKey(token);
    }
  } else if (v.publicLink === false) {
    update.public_token_hash = null;
    update.public_token_encrypted = null;
  }
  if (v.action === "open") {
    if (study.status !== "approved") throw conflict(`Recruitment opens only for an approved study; this one is ${study.status.replace("_", " ")}.`);
    const blocker = await recruitmentBlocker(db, studyId);
    if (blocker) throw conflict(blocker);
    update.status = "recruiting";
  } else if (v.action === "close") {
    if (study.status !== "recruiting") throw conflict("Recruitment is not open.");
    update.status = "closed";
  }
  await db("studies").where({ id: studyId }).update(update);
  await auditAs(db, user!, `recruitment.${v.action}`, studyId, { participantCap: v.participantCap, publicLink: v.publicLink });
  return recruitmentState(db, studyId);
}

/** Status, public link (decrypted for the team) and cap. */
export async function recruitmentState(q: Queryable, studyId: number): Promise<{ status: string; publicLink: string | null; participantCap: number | null }> {
  const row = await q<StudyDesignRow>("studies").where({ id: studyId }).first("status", "public_token_encrypted", "participant_cap");
  if (!row) throw notFound("No such study.");
  return { status: row.status, publicLink: row.public_token_encrypted ? publicLink(openWithDataKey(row.public_token_encrypted)) : null, participantCap: row.participant_cap };
}

/**
 * Makes invitations (editor or owner, recruiting studies only): N links for a CSV, or one e-mail
 * per address through the mail service (the address is kept encrypted, apart from the code).
 */
export async function createInvitations(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<NewParticipant[]> {
  const { study } = await assertCanEditStudy(db, user, studyId);
  if (study.status !== "recruiting") throw conflict("Open recruitment before inviting participants.");
  const v = invitationSchema.parse(input);
  const n = v.mode === "links" ? v.count : v.emails.length;
  await assertRoom(db, studyId, n);
  const made: NewParticipant[] = [];
  if (v.mode === "links") {
    await db.transaction(async (trx) => {
      for (let i = 0; i < v.count; i++) made.push(await insertParticipant(trx, studyId, "link"));
    });
    await auditAs(db, user!, "invitation.links", studyId, { count: made.length, codes: made.map((m) => m.code) });
    return made;
  }
  const { design } = await fetchDesign(db, studyId);
  const minutes = design ? designSummary(design).estimatedMinutes : 30;
  for (const email of v.emails) {
    const p = await db.transaction(async (trx) => {
      const p = await insertParticipant(trx, studyId, "email");
      await trx("participant_contacts").insert({ participant_id: p.id, email_encrypted: sealWithDataKey(email.trim().toLowerCase()) });
      return p;
    });
    const mail = invitationMail({ studyTitle: study.title, minutes, compensation: design?.compensation ?? "", link: p.link, researcher: user!.name });
    await sendMail({ to: email, subject: mail.subject, text: mail.text, template: "study-invitation", participantId: p.id });
    made.push(p);
  }
  await auditAs(db, user!, "invitation.email", studyId, { count: made.length, codes: made.map((m) => m.code) });
  return made;
}

/**
 * A visitor of the public link gets a participant row of their own (source "public") and a
 * session token; refused when the link is unknown, the study is not recruiting, or the cap is full.
 */
export async function visitPublicLink(db: Knex, publicToken: string): Promise<NewParticipant> {
  const study = await db<StudyDesignRow>("studies").where({ public_token_hash: hashToken(publicToken) }).first("id", "status");
  if (!study) throw notFound("This link is not valid.");
  if (study.status !== "recruiting") throw conflict("This study is not taking participants at the moment.");
  await assertRoom(db, study.id, 1);
  const p = await insertParticipant(db, study.id, "public");
  await appendAudit(db, { actorUserId: null, actorLabel: "participant", action: "invitation.public_visit", studyId: study.id, details: { code: p.code } });
  return p;
}

export type ParticipantListItem = { code: string; source: ParticipantSource; status: ParticipantListRow["status"]; createdAt: Date; consentedAt: Date | null; completedAt: Date | null; withdrawnAt: Date | null };

/** The participants of a study by pseudonymous code (no identities). */
export async function listParticipants(q: Queryable, studyId: number): Promise<ParticipantListItem[]> {
  const rows: ParticipantListRow[] = await q("participants").where("study_id", studyId).orderBy("id").select("id", "code", "source", "status", "created_at", "consented_at", "completed_at", "withdrawn_at");
  return rows.map((r) => ({ code: r.code, source: r.source, status: r.status, createdAt: r.created_at, consentedAt: r.consented_at, completedAt: r.completed_at, withdrawnAt: r.withdrawn_at }));
}
