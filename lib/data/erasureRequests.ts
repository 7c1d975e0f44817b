import type { Knex } from "knex";
import { z } from "zod";
import { assertOwnsStudy, type SessionUser } from "@/lib/auth/guards";
import { conflict, notFound } from "@/lib/errors";
import { PARTICIPANT_CODE_PATTERN } from "@/lib/recruitment/codes";
import { erasureDeadline } from "@/lib/recruitment/erasureWindow";
import { eraseParticipant, type ErasureReport } from "./erasure";

export const erasureRequestSchema = z.strictObject({
  /** The participant's code as they quote it ("p-7kq2mx" is read as P-7KQ2MX). */
  code: z.string().trim().transform((s) => s.toUpperCase().replace(/^P(?=[^-])/, "P-")).pipe(z.string().regex(PARTICIPANT_CODE_PATTERN, "A participant code looks like P-7KQ2MX.")),
  /** The owner confirms that this cannot be undone. */
  confirm: z.literal(true, { error: "Confirm that the erasure cannot be undone." }),
});
export type ErasureRequest = z.input<typeof erasureRequestSchema>;

/**
 * Erases a participant on their request, by the code they quote (eraseByCode; the study's owner
 * alone): every row that belongs to them, through the erasure core (lib/data/erasure.ts), which
 * also supersedes the archives that held them and audit-logs the erasure with counts only — no
 * reason is asked for, so none can reach the audit log. Possible at any time within the window the
 * consent text stated (counted from the end of the session), completed sessions included.
 * A pilot is deleted from the participants page instead.
 * @throws 403 not the owner, 404 no such code in the study, 409 a pilot, or the window has closed.
 */
export async function eraseByCode(db: Knex, user: SessionUser | null, studyId: number, input: unknown, now = new Date()): Promise<ErasureReport> {
  await assertOwnsStudy(db, user, studyId);
  const { code } = erasureRequestSchema.parse(input);
  const p = await db("participants as p").leftJoin("study_reviews as v", "v.id", "p.protocol_version_id").where({ "p.study_id": studyId, "p.code": code })
    .first<{ id: number; kind: string; completed_at: Date | null; withdrawn_at: Date | null; last_activity_at: Date | null; window: number | null } | undefined>(
      "p.id", "p.kind", "p.completed_at", "p.withdrawn_at", "p.last_activity_at", "v.erasure_window_days as window",
    );
  if (!p) throw notFound(`No participant ${code} in this study. Check the code with the participant (it is on every page of their session and in their consent copy).`);
  if (p.kind !== "real") throw conflict(`${code} is a ${p.kind} participant: delete it on the participants page.`);
  const deadline = erasureDeadline(p.window, p.completed_at ?? p.withdrawn_at ?? p.last_activity_at);
  if (deadline && now.getTime() > deadline.getTime()) {
    throw conflict(`The consent text gave ${p.window} days after the session for erasure; for ${code} that ended on ${deadline.toISOString().slice(0, 10)}. Ask your ethics board how to proceed.`);
  }
  return eraseParticipant(db, p.id, { actor: { userId: user!.id, label: user!.email } });
}
