import type { Knex } from "knex";
import { hitLimit, type Limit } from "@/lib/auth/rate-limit";
import type { SessionContext } from "@/lib/data/participants";
import { consentCopyText } from "@/lib/runner";
import { sendMail } from "./send";

/** Consent copies sent from one client address in an hour (public links make participants freely). */
export const CONSENT_COPY_ADDRESS_LIMIT: Limit = { name: "consent copy address", max: 5, windowMs: 60 * 60_000 };

/**
 * Sends the participant the copy of what they signed (sendConsentCopy): at most one per
 * participant (a second request finds the first in the mail log) and a few per client address,
 * so the consent form cannot be used to send mail to strangers. The address is used for sending
 * only; the log names the participant, not the address.
 * @returns whether the copy went out.
 */
export async function sendConsentCopy(db: Knex, ctx: SessionContext, to: string, clientAddress: string, signed: { version: number; hash: string; signedAt: Date; body: string }, withdrawLink: string): Promise<boolean> {
  const sent = await db("outgoing_mail").where({ participant_id: ctx.participant.id, template: "consent-copy" }).first("id");
  if (sent) return false;
  if (!(await hitLimit(db, CONSENT_COPY_ADDRESS_LIMIT, clientAddress)).within) return false;
  const mail = consentCopyText({ participantCode: ctx.participant.code, studyTitle: ctx.study.title, version: signed.version, hash: signed.hash, signedAt: signed.signedAt, body: signed.body, withdrawLink });
  try {
    await sendMail({ to, subject: mail.subject, text: mail.text, template: "consent-copy", participantId: ctx.participant.id });
    return true;
  } catch {
    return false; // recorded as failed in outgoing_mail; consent stands
  }
}
