import type { SessionUser } from "@/lib/auth/guards";
import { appendAudit } from "@/lib/data/audit";
import type { Queryable } from "@/lib/db";

/**
 * Logs one action of a signed-in user on a study in the chained audit log. Pass the action's
 * transaction (appendAudit): the entry commits with the action or not at all.
 */
export function auditAs(db: Queryable, user: SessionUser, action: string, studyId: number, details: Record<string, unknown> = {}): Promise<void> {
  return appendAudit(db, { actorUserId: user.id, actorLabel: user.email, action, studyId, details });
}
