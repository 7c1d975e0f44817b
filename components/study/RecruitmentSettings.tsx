"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiSend } from "./api";

type Settings = { inactivityMinutes: number; panelParam: string | null; returnUrlComplete: string | null; returnUrlScreened: string | null };

/**
 * The owner's settings for recruiting through a panel and for replacing drop-outs: the inactivity
 * time after which a started participant gives their counterbalancing place back, the query
 * parameter that carries a panel's participant id, and the return addresses.
 */
export function RecruitmentSettings({ studyId, initial, publicLink }: { studyId: number; initial: Settings; publicLink: string | null }) {
  const router = useRouter();
  const [v, setV] = useState({ inactivity: String(initial.inactivityMinutes), panel: initial.panelParam ?? "", complete: initial.returnUrlComplete ?? "", screened: initial.returnUrlScreened ?? "" });
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  const example = publicLink && v.panel ? `${publicLink}?${v.panel}=…` : null;
  return (
    <form className="card space-y-2" noValidate onSubmit={async (e) => {
      e.preventDefault();
      setMsg(null);
      try {
        await apiSend("POST", `/api/studies/${studyId}/recruitment`, {
          action: "settings", inactivityMinutes: Number(v.inactivity), panelParam: v.panel.trim() === "" ? null : v.panel.trim(), returnUrlComplete: v.complete, returnUrlScreened: v.screened,
        });
        setMsg({ ok: true, text: "Settings saved." });
        router.refresh();
      } catch (err) {
        setMsg({ ok: false, text: err instanceof Error ? err.message : String(err) });
      }
    }}>
      <h2>Panels and drop-outs</h2>
      <div className="grid gap-3 md:grid-cols-2">
        <div><label htmlFor="inactivity">Give a place back after this many minutes without activity</label><input id="inactivity" className="input w-32" inputMode="numeric" value={v.inactivity} onChange={(e) => setV({ ...v, inactivity: e.target.value })} /></div>
        <div><label htmlFor="panel-param">Query parameter with the panel&apos;s participant id (empty: none)</label><input id="panel-param" className="input" value={v.panel} onChange={(e) => setV({ ...v, panel: e.target.value })} placeholder="for example pid" /></div>
        <div><label htmlFor="return-complete">Return address after completion ({"{code}"}: the completion code)</label><input id="return-complete" className="input" value={v.complete} onChange={(e) => setV({ ...v, complete: e.target.value })} placeholder="https://…" /></div>
        <div><label htmlFor="return-screened">Return address when screened out (device check, study full)</label><input id="return-screened" className="input" value={v.screened} onChange={(e) => setV({ ...v, screened: e.target.value })} placeholder="https://…" /></div>
      </div>
      {example && <p className="text-sm">Give the panel this link: <code className="break-all">{example}</code></p>}
      <p className="text-xs text-slate-600">Panel ids are stored encrypted, shown to you alone on the Participants page for matching payments, and never exported. {"{panel_id}"} in a return address passes the id back to the panel.</p>
      {msg && <p className={msg.ok ? "notice" : "field-error"} role={msg.ok ? "status" : "alert"}>{msg.text}</p>}
      <button className="btn-secondary">Save settings</button>
    </form>
  );
}
