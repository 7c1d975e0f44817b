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
import { fetchInForceVersion } from "@/lib/study/service/protocol";
import type { ParticipantListRow, StudyDesignRow } from "@/lib/study/service/rows";
import { invitationActionSchema, recruitmentSchema, invitationSchema } from "@/lib/study/schemas";
import { studyDesignSchema } from "@/lib/study/design";
import { assertCapRoom } from "@/lib/data/places";
import { designSummary } from "@/lib/study/summary/designSummary";
import { newCompletionCode, newParticipantCode } from "./codes";
import { keyedHashWithDataKey, openWithDataKey, sealWithDataKey } from "./dataKey";
import { invitationMail } from "./invitationMail";

export type ParticipantSource = "link" | "email" | "public";
export type NewParticipant = { id: number; code: string; token: string; link: string; completionCode: string };

/** The participant's session link, /s/<token>, on the configured public address. */
export const sessionLink = (token: string) => `${env.NEXTAUTH_URL.replace(/\/$/, "")}/s/${token}`;
/** The study's public link, /s/public/<token>. */
export const publicLink = (token: string) => `${env.NEXTAUTH_URL.replace(/\/$/, "")}/s/public/${token}`;

/**
 * Why recruitment cannot open, or null when it can: an approved protocol version must be in
 * force (participants run that version; later edits wait for their own review as an amendment).
 */
export async function recruitmentBlocker(q: Queryable, studyId: number): Promise<string | null> {
  return (await fetchInForceVersion(q, studyId)) ? null : "No protocol version is approved yet.";
}

/**
 * Inserts one participant with a fresh 128-bit link token (only its hash is stored), a code
 * unique in the study ("P-XXXXXX", retried on a clash) and a completion code. `extra` sets other
 * columns (a pilot's kind and design, a panel id, the first activity of a public visitor).
 */
export async function insertParticipant(q: Queryable, studyId: number, source: ParticipantSource, extra: Record<string, unknown> = {}): Promise<NewParticipant> {
  for (let attempt = 0; ; attempt++) {
    const { token, hash } = newToken(16);
    const code = newParticipantCode();
    const completionCode = newCompletionCode();
    try {
      const [id] = await q("participants").insert({ study_id: studyId, code, token_hash: hash, source, status: "invited", completion_code: completionCode, ...extra });
      return { id: Number(id), code, token, link: sessionLink(token), completionCode };
    } catch (e) {
      if ((e as { code?: string }).code !== "ER_DUP_ENTRY" || attempt >= 5) throw e;
    }
  }
}

/** Recruitment as the owner sets it up. */
export type RecruitmentState = {
  status: string;
  publicLink: string | null;
  participantCap: number | null;
  inactivityMinutes: number;
  panelParam: string | null;
  returnUrlComplete: string | null;
  returnUrlScreened: string | null;
};

/**
 * Opens recruitment (owner; an approved protocol version in force), closes it, or changes the
 * settings: cap, public link, inactivity time, the panel's id parameter and the return addresses.
 */
export async function changeRecruitment(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<RecruitmentState> {
  const { study } = await assertOwnsStudy(db, user, studyId);
  const v = recruitmentSchema.parse(input);
  const update: Record<string, unknown> = { updated_at: db.fn.now(3) };
  if (v.participantCap !== undefined) update.participant_cap = v.participantCap;
  if (v.inactivityMinutes !== undefined) update.inactivity_minutes = v.inactivityMinutes;
  if (v.panelParam !== undefined) update.panel_param = v.panelParam;
  if (v.returnUrlComplete !== undefined) update.return_url_complete = v.returnUrlComplete;
  if (v.returnUrlScreened !== undefined) update.return_url_screened = v.returnUrlScreened;
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
  // The status is read again under the study's row lock and written only from the status it was
  // read in, with the approved version checked inside the lock: of any number of parallel
  // requests one opens (or closes), and never a study whose approval is not in force.
  await db.transaction(async (trx) => {
    const locked = await trx("studies").where({ id: studyId }).forUpdate().first<{ status: string }>("status");
    const status = locked?.status ?? study.status;
    if (v.action === "open") {
      if (status !== "approved") throw conflict(`Recruitment opens only for an approved study; this one is ${status.replace("_", " ")}.`);
      const blocker = await recruitmentBlocker(trx, studyId);
      if (blocker) throw conflict(blocker);
      update.status = "recruiting";
    } else if (v.action === "close") {
      if (status !== "recruiting") throw conflict("Recruitment is not open.");
      update.status = "closed";
    }
    const n = await trx("studies").where({ id: studyId, status }).update(update);
    if (n !== 1) throw conflict("The study changed meanwhile; reload and try again.");
    await auditAs(trx, user!, `recruitment.${v.action}`, studyId, {
      participantCap: v.participantCap, publicLink: v.publicLink, inactivityMinutes: v.inactivityMinutes, panelParam: v.panelParam,
      returnAddresses: v.returnUrlComplete !== undefined || v.returnUrlScreened !== undefined ? "changed" : undefined,
    });
  });
  return recruitmentState(db, studyId);
}

/** Status, public link (decrypted for the team), cap and the other recruitment settings. */
export async function recruitmentState(q: Queryable, studyId: number): Promise<RecruitmentState> {
  const row = await q("studies").where({ id: studyId }).first<{ status: string; public_token_encrypted: string | null; participant_cap: number | null; inactivity_minutes: number; panel_param: string | null; return_url_complete: string | null; return_url_screened: string | null } | undefined>(
    "status", "public_token_encrypted", "participant_cap", "inactivity_minutes", "panel_param", "return_url_complete", "return_url_screened",
  );
  if (!row) throw notFound("No such study.");
  return {
    status: row.status, publicLink: row.public_token_encrypted ? publicLink(openWithDataKey(row.public_token_encrypted)) : null, participantCap: row.participant_cap,
    inactivityMinutes: row.inactivity_minutes, panelParam: row.panel_param, returnUrlComplete: row.return_url_complete, returnUrlScreened: row.return_url_screened,
  };
}

/**
 * Makes invitations (editor or owner, recruiting studies only): N links for a CSV, or one e-mail
 * per address through the mail service, in the approved version's invitation text (the address
 * and the link's token are kept encrypted, apart from the code, so a reminder carries the same
 * link). The cap is not checked here: it counts participants who take part (consent checks it),
 * not invitations, some of which are never answered.
 */
export async function createInvitations(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<NewParticipant[]> {
  const { study } = await assertCanEditStudy(db, user, studyId);
  if (study.status !== "recruiting") throw conflict("Open recruitment before inviting participants.");
  const v = invitationSchema.parse(input);
  const made: NewParticipant[] = [];
  if (v.mode === "links") {
    await db.transaction(async (trx) => {
      for (let i = 0; i < v.count; i++) made.push(await insertParticipant(trx, studyId, "link"));
      await auditAs(trx, user!, "invitation.links", studyId, { count: made.length, codes: made.map((m) => m.code) });
    });
    return made;
  }
  const compose = await invitationComposer(db, studyId, user!.name);
  // every invitation and its entry commit together; the mails go out afterwards (a failed send is
  // recorded in the mail log, and the invitation can be sent again)
  const addressed = await db.transaction(async (trx) => {
    const addressed: { email: string; p: NewParticipant }[] = [];
    for (const email of v.emails) {
      const p = await insertParticipant(trx, studyId, "email");
      await trx("participant_contacts").insert({ participant_id: p.id, email_encrypted: sealWithDataKey(email.trim().toLowerCase()), token_encrypted: sealWithDataKey(p.token), sent_count: 1, last_sent_at: new Date() });
      addressed.push({ email, p });
    }
    await auditAs(trx, user!, "invitation.email", studyId, { count: addressed.length, codes: addressed.map((a) => a.p.code) });
    return addressed;
  });
  let failure: unknown = null;
  for (const { email, p } of addressed) {
    const mail = compose(p.link, false);
    await sendMail({ to: email, subject: mail.subject, text: mail.text, template: "study-invitation", participantId: p.id }).catch((e: unknown) => { failure ??= e; });
    made.push(p);
  }
  if (failure) throw failure;
  return made;
}

/**
 * The invitation e-mail of a study as the version in force words it (invitationComposer): the
 * approved invitation text, title, compensation and the planned minutes.
 */
async function invitationComposer(q: Queryable, studyId: number, researcher: string): Promise<(link: string, reminder: boolean) => { subject: string; text: string }> {
  const inForce = await fetchInForceVersion(q, studyId);
  const { design: working } = await fetchDesign(q, studyId);
  const parsed = inForce ? studyDesignSchema.safeParse(inForce.design) : null;
  const design = parsed?.success ? parsed.data : working;
  const minutes = design ? designSummary(design).estimatedMinutes : 30;
  const title = inForce?.title || (await q("studies").where({ id: studyId }).first<{ title: string }>("title"))!.title;
  return (link, reminder) => invitationMail({ studyTitle: title, minutes, compensation: design?.compensation ?? "", link, researcher, text: inForce?.invitationText ?? null, reminder });
}

/** The study a public link token opens (id, status, panel parameter), or undefined. */
export async function studyOfPublicLink(q: Queryable, publicToken: string): Promise<{ id: number; status: string; panelParam: string | null } | undefined> {
  const row = await q("studies").where({ public_token_hash: hashToken(publicToken) }).first<{ id: number; status: string; panel_param: string | null } | undefined>("id", "status", "panel_param");
  return row ? { id: row.id, status: row.status, panelParam: row.panel_param } : undefined;
}

/**
 * A visitor of the public link pressed "Start" (visitPublicLink): they get a participant row of
 * their own (source "public") and a session token. Nothing is created by merely opening the link
 * (a GET shows the information page), so link previews and scanners make no participants. The
 * cap is checked under the study row's lock, so two visitors cannot both take the last place. A
 * panel's participant id is kept encrypted, with a keyed hash that finds a second start with the
 * same id (refused: that person continues in the browser where they started).
 * @throws 404 unknown link, 409 not recruiting / cap reached ("full") / panel id already started.
 */
export async function visitPublicLink(db: Knex, publicToken: string, options: { panelId?: string | null } = {}): Promise<NewParticipant> {
  const study = await studyOfPublicLink(db, publicToken);
  if (!study) throw notFound("This link is not valid.");
  if (study.status !== "recruiting") throw conflict("This study is not taking participants at the moment.");
  const panelId = options.panelId?.trim() || null;
  const now = new Date();
  const p = await db.transaction(async (trx) => {
    await trx("studies").where({ id: study.id }).forUpdate().first("id");
    const hmac = panelId ? keyedHashWithDataKey(`panel:${study.id}:${panelId}`) : null;
    if (hmac && (await trx("participants").where({ study_id: study.id, panel_id_hmac: hmac }).first("id"))) {
      throw conflict("This panel id has already started this study, in another browser or tab: please continue there.");
    }
    await assertCapRoom(trx, study.id, now);
    const p = await insertParticipant(trx, study.id, "public", { last_activity_at: now, ...(panelId ? { panel_id_encrypted: sealWithDataKey(panelId), panel_id_hmac: hmac } : {}) });
    await appendAudit(trx, { actorUserId: null, actorLabel: "participant", action: "invitation.public_visit", studyId: study.id, details: { code: p.code, panel: panelId !== null } });
    return p;
  });
  return p;
}

export type ParticipantListItem = { code: string; source: ParticipantSource; status: ParticipantListRow["status"]; createdAt: Date; consentedAt: Date | null; completedAt: Date | null; withdrawnAt: Date | null };

/** The real participants of a study by pseudonymous code (no identities; pilots are listed on the participants page). */
export async function listParticipants(q: Queryable, studyId: number): Promise<ParticipantListItem[]> {
  const rows: ParticipantListRow[] = await q("participants").where({ study_id: studyId, kind: "real" }).orderBy("id").select("id", "code", "source", "status", "created_at", "consented_at", "completed_at", "withdrawn_at");
  return rows.map((r) => ({ code: r.code, source: r.source, status: r.status, createdAt: r.created_at, consentedAt: r.consented_at, completedAt: r.completed_at, withdrawnAt: r.withdrawn_at }));
}

/** One invitation as the team sees it; the address only for the owner. */
export type InvitationItem = {
  participantId: number;
  code: string;
  source: ParticipantSource;
  status: ParticipantListRow["status"];
  createdAt: Date;
  sentCount: number | null;
  lastSentAt: Date | null;
  revokedAt: Date | null;
  /** The e-mail address: decrypted for the study's owner only, null for everyone else. */
  email: string | null;
};

/**
 * The study's invitations (listInvitations), newest first: code, status and mailing history for
 * the team; which address got which code for the owner alone (decrypted here, never stored in clear).
 */
export async function listInvitations(q: Queryable, studyId: number, isOwner: boolean): Promise<InvitationItem[]> {
  const rows = await q("participants as p").leftJoin("participant_contacts as c", "c.participant_id", "p.id")
    .where({ "p.study_id": studyId, "p.kind": "real" }).whereIn("p.source", ["email", "link"]).orderBy("p.id", "desc").limit(2000)
    .select<{ id: number; code: string; source: ParticipantSource; status: ParticipantListRow["status"]; created_at: Date; revoked_at: Date | null; email_encrypted: string | null; sent_count: number | null; last_sent_at: Date | null }[]>(
      "p.id", "p.code", "p.source", "p.status", "p.created_at", "p.revoked_at", "c.email_encrypted", "c.sent_count", "c.last_sent_at",
    );
  return rows.map((r) => ({
    participantId: r.id, code: r.code, source: r.source, status: r.status, createdAt: r.created_at, sentCount: r.sent_count, lastSentAt: r.last_sent_at, revokedAt: r.revoked_at,
    email: isOwner && r.email_encrypted ? openWithDataKey(r.email_encrypted) : null,
  }));
}

/**
 * Re-sends, reminds or revokes one invitation (editor or owner; audit-logged by code, never by
 * address). Re-send: the same invitation again, to someone who has not opened it yet. Remind: a
 * reminder to someone who has not finished. Both carry the same link (its token is kept
 * encrypted). Revoke: an invitation nobody has used yet stops opening a session.
 * @throws 404 not an invitation of this study, 409 when the action does not fit its state.
 */
export async function manageInvitation(db: Knex, user: SessionUser | null, studyId: number, participantId: number, input: unknown): Promise<InvitationItem> {
  await assertCanEditStudy(db, user, studyId);
  const { action } = invitationActionSchema.parse(input);
  const p = await db("participants as p").leftJoin("participant_contacts as c", "c.participant_id", "p.id").where({ "p.id": participantId, "p.study_id": studyId, "p.kind": "real" })
    .first<{ id: number; code: string; source: ParticipantSource; status: ParticipantListRow["status"]; revoked_at: Date | null; email_encrypted: string | null; token_encrypted: string | null } | undefined>(
      "p.id", "p.code", "p.source", "p.status", "p.revoked_at", "c.email_encrypted", "c.token_encrypted",
    );
  if (!p) throw notFound("No such invitation in this study.");
  if (p.revoked_at) throw conflict("This invitation was revoked.");
  if (action === "revoke") {
    if (p.status !== "invited") throw conflict(`${p.code} has already started; they can withdraw, or you can exclude their data.`);
    await db.transaction(async (trx) => {
      await trx("participants").where({ id: p.id, status: "invited" }).update({ revoked_at: new Date() });
      await auditAs(trx, user!, "invitation.revoke", studyId, { code: p.code });
    });
  } else {
    if (!p.email_encrypted || !p.token_encrypted) throw conflict("Only e-mail invitations made since reminders exist can be sent again; make a new link instead.");
    if (action === "resend" && p.status !== "invited") throw conflict(`${p.code} has already opened the invitation: send a reminder instead.`);
    if (action === "remind" && (p.status === "completed" || p.status === "withdrawn")) throw conflict(`${p.code} has ${p.status === "completed" ? "finished" : "withdrawn"}: no reminder is sent.`);
    const study = await db("studies").where({ id: studyId }).first<{ status: string }>("status");
    if (study?.status !== "recruiting") throw conflict("Recruitment is not open.");
    const mail = (await invitationComposer(db, studyId, user!.name))(sessionLink(openWithDataKey(p.token_encrypted)), action === "remind");
    await sendMail({ to: openWithDataKey(p.email_encrypted), subject: mail.subject, text: mail.text, template: action === "remind" ? "study-reminder" : "study-invitation", participantId: p.id });
    // the mail itself cannot be taken back; its count and its entry commit together
    await db.transaction(async (trx) => {
      await trx("participant_contacts").where({ participant_id: p.id }).update({ sent_count: trx.raw("sent_count + 1"), last_sent_at: new Date() });
      await auditAs(trx, user!, `invitation.${action}`, studyId, { code: p.code });
    });
  }
  return (await listInvitations(db, studyId, false)).find((i) => i.participantId === p.id)!;
}
