import { route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { verifyAuditChain } from "@/lib/data/audit";
import { getCurrentUser } from "@/lib/session";

export const GET = route(async () => {
  requireRole(await getCurrentUser(), "reviewer");
  return Response.json(await verifyAuditChain(db));
});
