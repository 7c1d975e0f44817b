import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { assertCanEditStudy, type SessionUser } from "@/lib/auth/guards";
import { conflict } from "@/lib/errors";
import { studyDesignSchema, type StudyDesign } from "../design";
import { designHash } from "../designHash";
import { auditAs } from "./audit";
import { editLock, fetchInForceVersion } from "./protocol";
import type { StudyDesignRow } from "./rows";

export type StoredDesign = { design: StudyDesign | null; designHash: string | null; participantCap: number | null; hasPublicLink: boolean };

/** The study's stored design (parsed again, so old rows get today's defaults) and recruitment settings. */
export async function fetchDesign(q: Queryable, studyId: number): Promise<StoredDesign> {
  const row = await q<StudyDesignRow>("studies").where({ id: studyId }).first("design", "design_hash", "participant_cap", "public_token_hash");
  const raw = typeof row?.design === "string" ? (JSON.parse(row.design) as unknown) : row?.design;
  const parsed = raw ? studyDesignSchema.safeParse(raw) : null;
  return { design: parsed?.success ? parsed.data : null, designHash: row?.design_hash ?? null, participantCap: row?.participant_cap ?? null, hasPublicLink: Boolean(row?.public_token_hash) };
}

/**
 * Saves the working copy's design (editor or owner). Refused while a submission waits for review
 * and once the study is closed (editLock). After approval the change is an amendment: participants
 * keep the approved version until a reviewer approves the amended one (`amendment: true`).
 * @throws 401/403/404 from the guard, 409 when locked, ZodError (422) for an invalid design.
 */
export async function saveDesign(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<{ designHash: string; amendment: boolean; backToDraft: false }> {
  const { study } = await assertCanEditStudy(db, user, studyId);
  const lock = await editLock(db, study, "design");
  if (lock) throw conflict(lock);
  const design = studyDesignSchema.parse(input);
  const hash = designHash(design);
  const current = await fetchDesign(db, studyId);
  const inForce = await fetchInForceVersion(db, studyId);
  const amendment = inForce !== null && inForce.designHash !== hash;
  if (current.designHash === hash) return { designHash: hash, amendment, backToDraft: false };
  await db.transaction(async (trx) => {
    // read again under the study's row lock (submitForReview takes it too): no design slips in after a submission froze it
    const locked = await trx("studies").where({ id: studyId }).forUpdate().first<{ id: number; status: typeof study.status }>("id", "status");
    const again = await editLock(trx, locked!, "design");
    if (again) throw conflict(again);
    await trx("studies").where({ id: studyId }).update({ design: JSON.stringify(design), design_hash: hash, updated_at: trx.fn.now(3) });
    await auditAs(trx, user!, "study.design", studyId, { designHash: hash, previousHash: current.designHash, ...(inForce ? { amendsVersion: inForce.version } : {}) });
  });
  return { designHash: hash, amendment, backToDraft: false };
}
