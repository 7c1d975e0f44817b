import nodemailer from "nodemailer";
import { db } from "@/lib/db";
import { env } from "@/lib/env";

const globalForMail = globalThis as unknown as { yawpointMail?: nodemailer.Transporter };

function transport(): nodemailer.Transporter {
  globalForMail.yawpointMail ??= nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined,
    // The local fake speaks plain SMTP on loopback; a real server is reached with TLS through env.
    ignoreTLS: env.MAIL_FAKE,
  });
  return globalForMail.yawpointMail;
}

/**
 * One message. `participantId` marks participant mail (invitations, consent copies): its log row
 * names the participant instead of the address, so the mail log cannot re-identify an encrypted
 * contact, and withdrawal and erasure purge it. Staff mail (resets, account invitations) logs
 * the account's address.
 */
export type OutgoingMessage = { to: string; subject: string; text: string; template: string; participantId?: number };

/**
 * Sends one message over SMTP and records it in outgoing_mail (status, message id or error).
 * @throws when the SMTP server refuses it; the failure is recorded first.
 */
export async function sendMail(message: OutgoingMessage): Promise<void> {
  const participant = message.participantId !== undefined;
  const [id] = await db("outgoing_mail").insert({
    to_address: participant ? null : message.to,
    participant_id: participant ? message.participantId : null,
    subject: message.subject.slice(0, 250),
    template: message.template,
  });
  try {
    const info = await transport().sendMail({ from: env.MAIL_FROM, to: message.to, subject: message.subject, text: message.text });
    await db("outgoing_mail").where({ id }).update({ status: "sent", message_id: String(info.messageId).slice(0, 250), sent_at: db.fn.now(3) });
  } catch (e) {
    await db("outgoing_mail").where({ id }).update({ status: "failed", error: String(e instanceof Error ? e.message : e).slice(0, 500) });
    throw e;
  }
}
