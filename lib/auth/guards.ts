import type { Queryable } from "@/lib/db";
import { fetchStudy, fetchTeamRole, type Study, type TeamRole } from "@/lib/data/studies";
import { forbidden, notFound, unauthorized } from "@/lib/errors";
import type { Role } from "./roles";

/** The signed-in user as the server sees them (from the JWT session). */
export type SessionUser = { id: number; email: string; name: string; role: Role };

/** @throws 401 when nobody is signed in. */
export function requireUser(user: SessionUser | null): SessionUser {
  if (!user) throw unauthorized();
  return user;
}

/** @throws 401 when nobody is signed in, 403 when the role is not one of `roles`. */
export function requireRole(user: SessionUser | null, ...roles: Role[]): SessionUser {
  const u = requireUser(user);
  if (!roles.includes(u.role)) throw forbidden();
  return u;
}

const TEAM_RANK: Record<TeamRole, number> = { viewer: 1, editor: 2, owner: 3 };

/**
 * Checks the user's place in the study's team on the server.
 * Reviewers may read every study that has reached review (read-only); researchers only their own.
 * @throws 401, 403, or 404 when the study does not exist.
 */
export async function assertStudyAccess(
  q: Queryable,
  user: SessionUser | null,
  studyId: number,
  need: "view" | "edit" | "own",
): Promise<{ study: Study; teamRole: TeamRole | null }> {
  const u = requireUser(user);
  const study = await fetchStudy(q, studyId);
  if (!study) throw notFound("No such study.");
  // Only researchers are ever on a team; a membership left from an earlier role counts for nothing.
  const teamRole = u.role === "researcher" ? await fetchTeamRole(q, studyId, u.id) : null;
  if (u.role === "reviewer" && need === "view" && study.status !== "draft") return { study, teamRole };
  if (u.role !== "researcher" || !teamRole) throw forbidden("You are not on this study's team.");
  const needed = need === "view" ? 1 : need === "edit" ? 2 : 3;
  if (TEAM_RANK[teamRole] < needed) throw forbidden(`This needs the ${need === "edit" ? "editor" : "owner"} role on the study.`);
  return { study, teamRole };
}

export const assertCanViewStudy = (q: Queryable, user: SessionUser | null, studyId: number) => assertStudyAccess(q, user, studyId, "view");
export const assertCanEditStudy = (q: Queryable, user: SessionUser | null, studyId: number) => assertStudyAccess(q, user, studyId, "edit");
export const assertOwnsStudy = (q: Queryable, user: SessionUser | null, studyId: number) => assertStudyAccess(q, user, studyId, "own");
