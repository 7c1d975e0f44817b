import { readJson } from "@/lib/api/body";
import { route } from "@/lib/api/respond";
import { inviteUser } from "@/lib/accounts/users";
import { requireRole } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { listUsers } from "@/lib/data/users";
import { inviteUserSchema } from "@/lib/schemas/users";
import { getCurrentUser } from "@/lib/session";

export const GET = route(async () => {
  requireRole(await getCurrentUser(), "admin");
  return Response.json({ users: await listUsers(db) });
});

export const POST = route(async (request: Request) => {
  const actor = requireRole(await getCurrentUser(), "admin");
  const input = await readJson(request, inviteUserSchema);
  return Response.json({ user: await inviteUser(db, actor, input) }, { status: 201 });
});
