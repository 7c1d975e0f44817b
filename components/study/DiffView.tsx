import type { DiffPart } from "@/lib/consent/consentDiff";

/** A line diff: removed lines marked "−" and struck through, added lines marked "+" (not colour alone). */
export function DiffView({ parts, label }: { parts: DiffPart[]; label: string }) {
  return (
    <pre aria-label={label} className="max-h-96 overflow-auto whitespace-pre-wrap rounded border border-slate-300 bg-white p-2 text-xs">
      {parts.flatMap((p, i) =>
        p.text.replace(/\n$/, "").split("\n").map((line, j) => (
          <div key={`${i}-${j}`} className={p.kind === "added" ? "bg-emerald-50 text-emerald-900" : p.kind === "removed" ? "bg-red-50 text-red-900 line-through" : "text-slate-600"}>
            {p.kind === "added" ? "+ " : p.kind === "removed" ? "− " : "  "}{line}
          </div>
        )),
      )}
    </pre>
  );
}
