import { getServerSession } from "next-auth";
import { authOptions } from "@/lib/auth/options";
import type { SessionUser } from "@/lib/auth/guards";
import { db } from "@/lib/db";
import { findUserById } from "@/lib/data/users";

/**
 * The signed-in user, or null. Works in server components, route handlers and server actions.
 * The role and the active flag are read from the database on every call, so a role change or a
 * deactivation takes effect at once rather than when the JWT expires; a session signed in before
 * the user's last password change, deactivation or role change (an older session version) ends.
 */
export async function getCurrentUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  if (!session?.user?.id) return null;
  const user = await findUserById(db, session.user.id);
  if (!user || !user.active || session.user.sv !== user.sessionVersion) return null;
  return { id: user.id, email: user.email, name: user.name, role: user.role };
}
