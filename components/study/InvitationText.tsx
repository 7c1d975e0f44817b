"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiSend } from "./api";

/** The invitation e-mail in the team's words: part of the protocol, so a change after approval is an amendment. */
export function InvitationText({ studyId, initial, approved, locked }: { studyId: number; initial: string; approved: string | null; locked: string | null }) {
  const router = useRouter();
  const [text, setText] = useState(initial);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  return (
    <form className="card space-y-2" onSubmit={async (e) => {
      e.preventDefault();
      setMsg(null);
      try {
        await apiSend("PUT", `/api/studies/${studyId}/invitation-text`, { text });
        setMsg({ ok: true, text: approved !== null ? "Saved as part of an amendment: invitations keep the approved text until a reviewer approves the change." : "Saved." });
        router.refresh();
      } catch (err) {
        setMsg({ ok: false, text: err instanceof Error ? err.message : String(err) });
      }
    }}>
      <h2>Invitation text</h2>
      <p className="text-sm">Your own words for the invitation e-mail: who you are, what the study is, that taking part is voluntary. The duration, the compensation and the personal link are added to every message. The reviewer approves this text with the protocol.</p>
      {approved !== null && <p className="text-xs text-slate-600">Invitations now use the approved text{approved ? "" : " (none was written: the product's default wording)"}.</p>}
      <label htmlFor="invitation-text" className="sr-only">Invitation text</label>
      <textarea id="invitation-text" className="input" rows={6} value={text} onChange={(e) => setText(e.target.value)} disabled={locked !== null} />
      {locked && <p className="notice">{locked}</p>}
      {msg && <p className={msg.ok ? "notice" : "field-error"} role={msg.ok ? "status" : "alert"}>{msg.text}</p>}
      <button className="btn-secondary" disabled={locked !== null}>Save invitation text</button>
    </form>
  );
}
