import { route } from "@/lib/api/respond";
import { requireRole } from "@/lib/auth/guards";
import { env } from "@/lib/env";
import { notFound } from "@/lib/errors";
import { fetchFakeMessages, messagesForViewer } from "@/lib/mail/fake";
import { getCurrentUser } from "@/lib/session";

/** What the local SMTP fake holds, others' personal links hidden; only where the fake is in use (development and tests). */
export const GET = route(async () => {
  const admin = requireRole(await getCurrentUser(), "admin");
  if (!env.MAIL_FAKE) throw notFound("The mail fake is not in use.");
  return Response.json({ messages: messagesForViewer(await fetchFakeMessages(), admin.email) });
});
