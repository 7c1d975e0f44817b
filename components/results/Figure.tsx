import type { ReactNode } from "react";

/** A plot with its caption: what it shows and in which units (read in print, too). */
export function Figure({ id, title, caption, children }: { id: string; title: string; caption: ReactNode; children: ReactNode }) {
  return (
    <figure className="card break-inside-avoid space-y-2" aria-labelledby={`${id}-title`} data-testid={`figure-${id}`}>
      <h3 id={`${id}-title`} className="text-base font-semibold">{title}</h3>
      <div className="w-full">{children}</div>
      <figcaption className="text-sm text-slate-700">{caption}</figcaption>
    </figure>
  );
}
