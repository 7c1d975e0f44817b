import type { ReactNode } from "react";
import { RoleLayout } from "@/components/nav/role-layout";

export default function Layout({ children }: { children: ReactNode }) {
  return <RoleLayout role="researcher">{children}</RoleLayout>;
}
