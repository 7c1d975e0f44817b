import { route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchStudiesInReview } from "@/lib/data/studies";
import { getCurrentUser } from "@/lib/session";

export const GET = route(async () => {
  requireRole(await getCurrentUser(), "reviewer");
  return Response.json({ studies: await fetchStudiesInReview(db) });
});
