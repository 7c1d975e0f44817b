import { route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchAuditHead } from "@/lib/data/audit";
import { keptHeadLine } from "@/lib/data/auditHeads";
import { getCurrentUser } from "@/lib/session";

/** GET: the audit chain's head as a small text file a reviewer keeps outside the system (reviewers only). */
export const GET = route(async () => {
  requireRole(await getCurrentUser(), "reviewer");
  const head = await fetchAuditHead(db);
  const at = new Date().toISOString();
  const text = `Yawpoint audit trail head, taken ${at}\n${head.entries} entries; newest entry ${head.lastId}.\nTo check later that nothing up to it changed, paste the next line into "Heads you kept" on the audit page:\n${keptHeadLine(head)}\n`;
  return new Response(text, {
    headers: { "content-type": "text/plain; charset=utf-8", "content-disposition": `attachment; filename="yawpoint-audit-head-${head.lastId}.txt"`, "cache-control": "no-store" },
  });
});
