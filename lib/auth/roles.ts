import { z } from "zod";

/** Account roles. Participants never get accounts. */
export const ROLES = ["admin", "researcher", "reviewer"] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

/** The area of the app each role works in, guarded by proxy.ts and again on the server. */
export const ROLE_HOME: Record<Role, string> = {
  admin: "/admin",
  researcher: "/studies",
  reviewer: "/review",
};

/** Which roles may enter an area (by path prefix). */
export const AREA_ROLES: { prefix: string; roles: readonly Role[] }[] = [
  { prefix: "/admin", roles: ["admin"] },
  { prefix: "/studies", roles: ["researcher"] },
  { prefix: "/analyses", roles: ["researcher"] },
  { prefix: "/review", roles: ["reviewer"] },
];

/** The roles an area allows, or null when the path is not a role area. */
export function rolesForPath(pathname: string): readonly Role[] | null {
  const area = AREA_ROLES.find((a) => pathname === a.prefix || pathname.startsWith(a.prefix + "/"));
  return area ? area.roles : null;
}
