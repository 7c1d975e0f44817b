"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiSend } from "./api";

/** Opens and closes recruitment, sets the cap and public link, makes links (CSV) and sends e-mail invitations. */
export function RecruitmentPanel({ studyId, status, isOwner, canEdit, cap, publicLink, publicQr = null, blocker }: { studyId: number; status: string; isOwner: boolean; canEdit: boolean; cap: number | null; publicLink: string | null; publicQr?: string | null; blocker: string | null }) {
  const router = useRouter();
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  const [capText, setCapText] = useState(cap === null ? "" : String(cap));
  const [count, setCount] = useState("10");
  const [emails, setEmails] = useState("");
  const run = async (f: () => Promise<string>) => {
    setMsg(null);
    try {
      setMsg({ ok: true, text: await f() });
      router.refresh();
    } catch (e) {
      setMsg({ ok: false, text: e instanceof Error ? e.message : String(e) });
    }
  };
  const recruitment = (action: string, extra: Record<string, unknown> = {}) => apiSend("POST", `/api/studies/${studyId}/recruitment`, { action, ...extra });
  const downloadLinks = async () => {
    const res = await fetch(`/api/studies/${studyId}/invitations`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ mode: "links", count: Number(count) }) });
    if (!res.ok) throw new Error(((await res.json()) as { error: { message: string } }).error.message);
    const blob = await res.blob();
    const a = document.createElement("a");
    a.href = URL.createObjectURL(blob);
    a.download = `study-${studyId}-links.csv`;
    a.click();
    URL.revokeObjectURL(a.href);
    return `${count} links made; the CSV is downloading. The links are shown only once.`;
  };
  const sendEmails = async () => {
    const list = emails.split(/[\s,;]+/).filter(Boolean);
    const r = await apiSend<{ invited: { code: string }[] }>("POST", `/api/studies/${studyId}/invitations`, { mode: "email", emails: list });
    setEmails("");
    return `Sent ${r.invited.length} invitation(s): ${r.invited.map((i) => i.code).join(", ")}.`;
  };
  return (
    <div className="space-y-4">
      {isOwner && (
        <div className="card space-y-2">
          <h2>Recruitment</h2>
          {status === "approved" && blocker && <p className="notice">Cannot open yet: {blocker}</p>}
          <div className="flex flex-wrap items-end gap-3">
            <div><label htmlFor="cap">Participant cap (empty: none)</label><input id="cap" className="input w-32" inputMode="numeric" value={capText} onChange={(e) => setCapText(e.target.value)} /></div>
            <button type="button" className="btn-secondary" onClick={() => run(async () => { await recruitment("settings", { participantCap: capText.trim() === "" ? null : Number(capText) }); return "Cap saved."; })}>Save cap</button>
            <button type="button" className="btn-secondary" onClick={() => run(async () => { await recruitment("settings", { publicLink: !publicLink }); return publicLink ? "Public link switched off." : "Public link made."; })}>{publicLink ? "Switch the public link off" : "Make a public link"}</button>
            {status === "approved" && <button type="button" className="btn" onClick={() => run(async () => { await recruitment("open"); return "Recruitment is open."; })}>Open recruitment</button>}
            {status === "recruiting" && <button type="button" className="btn-secondary" onClick={() => run(async () => { await recruitment("close"); return "Recruitment is closed."; })}>Close recruitment</button>}
          </div>
          {publicLink && <p className="text-sm">Public link (each visitor gets a code of their own): <code className="break-all" data-testid="public-link">{publicLink}</code></p>}
          {publicLink && publicQr && (
            <details className="text-sm">
              <summary>QR code of the public link (for a poster or a slide)</summary>
              {/* eslint-disable-next-line @next/next/no-img-element -- a data: URL made on the server */}
              <img src={publicQr} alt={`QR code for ${publicLink}`} width={200} height={200} className="mt-2 rounded border border-slate-300" />
            </details>
          )}
        </div>
      )}
      {canEdit && status === "recruiting" && (
        <div className="grid gap-4 md:grid-cols-2">
          <div className="card space-y-2">
            <h2>Links in bulk</h2>
            <label htmlFor="link-count">How many links</label>
            <input id="link-count" className="input w-32" inputMode="numeric" value={count} onChange={(e) => setCount(e.target.value)} />
            <button type="button" className="btn" onClick={() => run(downloadLinks)}>Make links (CSV)</button>
          </div>
          <div className="card space-y-2">
            <h2>Invite by e-mail</h2>
            <label htmlFor="invite-emails">Addresses (one per line)</label>
            <textarea id="invite-emails" className="input" rows={4} value={emails} onChange={(e) => setEmails(e.target.value)} />
            <p className="text-xs text-slate-600">Addresses are stored encrypted, apart from the participant codes.</p>
            <button type="button" className="btn" onClick={() => run(sendEmails)}>Send invitations</button>
          </div>
        </div>
      )}
      {msg && <p className={msg.ok ? "notice" : "field-error"} role={msg.ok ? "status" : "alert"}>{msg.text}</p>}
    </div>
  );
}
