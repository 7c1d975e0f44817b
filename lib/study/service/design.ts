import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { assertCanEditStudy, type SessionUser } from "@/lib/auth/guards";
import { conflict } from "@/lib/errors";
import { studyDesignSchema, type StudyDesign } from "../design";
import { designHash } from "../designHash";
import { EDITABLE_STATUSES } from "../status";
import { auditAs } from "./audit";
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
 * Saves a design (editor or owner). Refused while the study is in review, recruiting or closed.
 * A change after approval sends the study back to draft: it needs a new review.
 * @throws 401/403/404 from the guard, 409 in a locked status, ZodError (422) for an invalid design.
 */
export async function saveDesign(db: Knex, user: SessionUser | null, studyId: number, input: unknown): Promise<{ designHash: string; backToDraft: boolean }> {
  const { study } = await assertCanEditStudy(db, user, studyId);
  if (!EDITABLE_STATUSES.includes(study.status)) throw conflict(study.status === "in_review" ? "The study is in review: wait for the decision before changing the design." : "Close recruitment first: a running study's design cannot change.");
  const design = studyDesignSchema.parse(input);
  const hash = designHash(design);
  const current = await fetchDesign(db, studyId);
  if (current.designHash === hash) return { designHash: hash, backToDraft: false };
  const backToDraft = study.status === "approved";
  await db("studies").where({ id: studyId }).update({ design: JSON.stringify(design), design_hash: hash, status: backToDraft ? "draft" : study.status, updated_at: db.fn.now(3) });
  await auditAs(db, user!, "study.design", studyId, { designHash: hash, previousHash: current.designHash, ...(backToDraft ? { afterApproval: true } : {}) });
  return { designHash: hash, backToDraft };
}
