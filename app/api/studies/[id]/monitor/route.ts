import { NextResponse } from "next/server";
import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { assertCanViewStudy, requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchMonitor } from "@/lib/data/participants";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

export const dynamic = "force-dynamic";

/** Live monitor: sessions, last activity, data-quality flags. Researchers on the study's team only. */
export const GET = route(async (_request: Request, context: { params: Promise<{ id: string }> }) => {
  const { id } = parseParams(idParamSchema, await context.params);
  const user = requireRole(await getCurrentUser(), "researcher");
  await assertCanViewStudy(db, user, id);
  return NextResponse.json({ sessions: await fetchMonitor(db, id) }, { headers: { "Cache-Control": "no-store" } });
});
