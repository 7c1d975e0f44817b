/** One value of an entry's details, in words: lists joined, objects as key: value, nothing hidden. */
function show(v: unknown): string {
  if (v === null || v === undefined) return "—";
  if (Array.isArray(v)) return v.map(show).join(", ");
  if (typeof v === "object") return Object.entries(v as Record<string, unknown>).map(([k, x]) => `${k}: ${show(x)}`).join("; ");
  return String(v);
}

/** An audit entry's details as a short list (the hashed content, exactly as stored). */
export function AuditDetails({ details }: { details: unknown }) {
  const entries = details && typeof details === "object" && !Array.isArray(details) ? Object.entries(details as Record<string, unknown>).filter(([, v]) => v !== undefined) : [];
  if (entries.length === 0) return <span className="text-slate-500">—</span>;
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-2 text-xs">
      {entries.map(([k, v]) => (
        <div key={k} className="contents"><dt className="font-semibold">{k}</dt><dd className="break-all">{show(v)}</dd></div>
      ))}
    </dl>
  );
}
