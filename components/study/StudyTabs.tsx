"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

const TABS = [
  ["", "Overview"],
  ["/design", "Design"],
  ["/consent", "Consent"],
  ["/documents", "Documents"],
  ["/review", "Review"],
  ["/recruitment", "Recruitment"],
  ["/participants", "Participants"],
  ["/monitor", "Monitor"],
  ["/results", "Results"],
] as const;

/** The study page's tabs; the current one is marked for screen readers and in text weight. */
export function StudyTabs({ studyId }: { studyId: number }) {
  const path = usePathname();
  const base = `/studies/${studyId}`;
  return (
    <nav aria-label="Study" className="flex flex-wrap gap-1 border-b border-slate-300 text-sm">
      {TABS.map(([suffix, label]) => {
        const href = base + suffix;
        const current = suffix === "" ? path === base : path.startsWith(href);
        return (
          <Link key={href} href={href} aria-current={current ? "page" : undefined} className={`rounded-t px-3 py-1.5 ${current ? "border border-b-white border-slate-300 bg-white font-semibold text-slate-900" : "text-accent"}`}>
            {label}
          </Link>
        );
      })}
    </nav>
  );
}
