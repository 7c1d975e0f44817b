import { parseParams } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { fetchImportOf } from "@/lib/data/imports";
import { notFound } from "@/lib/errors";
import { idParamSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

type Ctx = { params: Promise<{ id: string }> };

/** One of the researcher's own imports with its analysis (others' imports answer 404). */
export const GET = route(async (_request: Request, context: Ctx) => {
  const user = requireRole(await getCurrentUser(), "researcher");
  const { id } = parseParams(idParamSchema, await context.params);
  const found = await fetchImportOf(db, user.id, id);
  if (!found) throw notFound("No such import.");
  return Response.json(found);
});
