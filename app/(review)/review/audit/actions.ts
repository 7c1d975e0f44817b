"use server";

import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { verifyAuditChain, type AuditVerification } from "@/lib/data/audit";
import { getCurrentUser } from "@/lib/session";

export async function verifyAuditAction(): Promise<AuditVerification> {
  requireRole(await getCurrentUser(), "reviewer");
  return verifyAuditChain(db);
}
