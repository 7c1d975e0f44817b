"use server";

import { ZodError } from "zod";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { verifyAuditChain, type AuditVerification } from "@/lib/data/audit";
import { parseKeptHeads } from "@/lib/data/auditHeads";
import { getCurrentUser } from "@/lib/session";

/** Verifies the chain, and that every head the reviewer kept (entry:hash lines) is still in it. */
export async function verifyAuditAction(keptText = ""): Promise<AuditVerification | { error: string }> {
  requireRole(await getCurrentUser(), "reviewer");
  try {
    return await verifyAuditChain(db, { kept: parseKeptHeads(keptText) });
  } catch (e) {
    if (e instanceof ZodError) return { error: e.issues[0]?.message ?? "A kept head is not in the form entry:hash." };
    throw e;
  }
}
