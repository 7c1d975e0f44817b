import type { Knex } from "knex";
import type { SessionUser } from "@/lib/auth/guards";
import { appendAudit } from "@/lib/data/audit";

/** Logs one action of a signed-in user on a study in the chained audit log. */
export function auditAs(db: Knex, user: SessionUser, action: string, studyId: number, details: Record<string, unknown> = {}): Promise<void> {
  return appendAudit(db, { actorUserId: user.id, actorLabel: user.email, action, studyId, details });
}
