import { redirect } from "next/navigation";
import type { ReactNode } from "react";
import { ROLE_HOME, type Role } from "@/lib/auth/roles";
import { getCurrentUser } from "@/lib/session";
import { AppFrame } from "./AppFrame";

/** The layout of a role area: checks the role on the server (proxy.ts is only the first check). */
export async function RoleLayout({ role, children }: { role: Role; children: ReactNode }) {
  const user = await getCurrentUser();
  if (!user) redirect("/signin");
  if (user.role !== role) redirect(ROLE_HOME[user.role]);
  return <AppFrame user={user}>{children}</AppFrame>;
}
