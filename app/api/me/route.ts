import { route } from "@/lib/api/respond";
import { requireUser } from "@/lib/auth/guards";
import { getCurrentUser } from "@/lib/session";

export const GET = route(async () => {
  const user = requireUser(await getCurrentUser());
  return Response.json({ user });
});
