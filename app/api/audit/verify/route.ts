import { z } from "zod";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { verifyAuditChain } from "@/lib/data/audit";
import { parseKeptHeads } from "@/lib/data/auditHeads";
import { getCurrentUser } from "@/lib/session";

const querySchema = z.strictObject({ kept: z.string().max(20_000).optional() });

/** GET ?kept=entry:hash,…: verifies the chain and that every kept head is still in it (reviewers only). */
export const GET = route(async (request: Request) => {
  requireRole(await getCurrentUser(), "reviewer");
  const { kept } = parseParams(querySchema, Object.fromEntries(new URL(request.url).searchParams));
  return Response.json(await verifyAuditChain(db, { kept: parseKeptHeads(kept ?? "") }));
});
