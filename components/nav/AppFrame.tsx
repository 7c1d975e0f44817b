import Link from "next/link";
import type { ReactNode } from "react";
import { SignOutButton } from "@/components/auth/SignOutButton";
import type { SessionUser } from "@/lib/auth/guards";
import type { Role } from "@/lib/auth/roles";

/** Navigation per role: each role sees only the areas it may use. */
const NAV: Record<Role, { href: string; label: string }[]> = {
  researcher: [
    { href: "/studies", label: "Studies" },
    { href: "/analyses", label: "Analyse a trial table" },
  ],
  reviewer: [{ href: "/review", label: "Review queue" }, { href: "/review/audit", label: "Audit trail" }],
  admin: [
    { href: "/admin", label: "Users" },
    { href: "/admin/mail", label: "Mail (development)" },
  ],
};

export function AppFrame({ user, children }: { user: SessionUser; children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <header className="border-b border-slate-200 bg-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <Link href="/" className="text-lg font-bold text-accent no-underline">Yawpoint</Link>
          <nav aria-label="Main" className="flex flex-wrap gap-4 text-sm">
            {NAV[user.role].map((item) => (
              <Link key={item.href} href={item.href}>{item.label}</Link>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="text-slate-700">
              {user.name} <span className="rounded bg-slate-100 px-1.5 py-0.5 text-xs text-slate-700">{user.role}</span>
            </span>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-6">{children}</main>
    </div>
  );
}
