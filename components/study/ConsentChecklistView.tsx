import type { ConsentChecklistItem } from "@/lib/consent/consentChecklist";

/** The consent checklist: each element "found" or "missing" in words. */
export function ConsentChecklistView({ items }: { items: ConsentChecklistItem[] }) {
  const missing = items.filter((i) => !i.present).length;
  return (
    <div className="space-y-1 text-sm">
      <p>{missing === 0 ? "Every listed element seems to be mentioned." : `${missing} element(s) seem to be missing.`} The list follows the basic elements of informed consent in the US Common Rule (45 CFR 46.116); your ethics board's own requirements come first.</p>
      <ul aria-label="Consent checklist" className="space-y-0.5">
        {items.map((i) => (
          <li key={i.id}><span className={i.present ? "font-semibold text-emerald-800" : "font-semibold text-red-800"}>{i.present ? "found" : "missing"}</span> — {i.label} <span className="text-xs text-slate-600">({i.basis})</span></li>
        ))}
      </ul>
    </div>
  );
}
