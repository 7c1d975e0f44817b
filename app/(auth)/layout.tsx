import type { ReactNode } from "react";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="mx-auto mt-16 max-w-sm px-4">
      <p className="mb-6 text-2xl font-bold tracking-tight text-accent">Yawpoint</p>
      <div className="card">{children}</div>
      <p className="mt-6 text-xs text-slate-600">Motion-sensor aiming studies, from protocol to open data. Participants need no account: they use the link their study sent them.</p>
    </main>
  );
}
