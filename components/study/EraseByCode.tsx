"use client";

import { useState } from "react";
import { apiSend } from "./api";
import { ActionMessageView, useAction } from "./useAction";

type Erasure = { code: string; alreadyErased: boolean; removed: Record<string, number>; supersededExports: number[] };

/**
 * The owner erases a participant's data when the participant asks, by the code the participant
 * quotes: every row goes, archives that held them are superseded (downloads refused), and the
 * audit log records the erasure without any reason.
 */
export function EraseByCode({ studyId, windowDays }: { studyId: number; windowDays: number | null }) {
  const { msg, act } = useAction();
  const [code, setCode] = useState("");
  const [sure, setSure] = useState(false);
  const [done, setDone] = useState<Erasure | null>(null);
  return (
    <section className="card space-y-2" aria-labelledby="erase-heading">
      <h2 id="erase-heading">Erase a participant&apos;s data on request</h2>
      <p className="max-w-prose text-sm">
        Participants see their code on every page of their session and in their consent copy. With it, you can erase everything they recorded
        {windowDays === null ? " at any time" : ` up to ${windowDays} days after their session, as the consent text states`}. Archives that held them are superseded and can no longer be downloaded; the audit log records the erasure and what was removed, never a reason.
        Follow your ethics board&apos;s procedure for such requests.
      </p>
      <form className="flex flex-wrap items-end gap-3" onSubmit={(e) => {
        e.preventDefault();
        void act(async () => {
          const r = await apiSend<{ erasure: Erasure }>("POST", `/api/studies/${studyId}/erasures`, { code, confirm: sure });
          setDone(r.erasure);
          setCode("");
          setSure(false);
        }, `${code.trim().toUpperCase()} is erased.`);
      }}>
        <div><label htmlFor="erase-code">Participant code</label><input id="erase-code" className="input w-40 font-mono" value={code} onChange={(e) => setCode(e.target.value)} placeholder="P-7KQ2MX" autoComplete="off" /></div>
        <label className="flex items-center gap-2 text-sm"><input type="checkbox" checked={sure} onChange={(e) => setSure(e.target.checked)} /> I understand this cannot be undone</label>
        <button className="btn" disabled={!sure || code.trim() === ""}>Erase</button>
      </form>
      <ActionMessageView msg={msg} />
      {done && (
        <p className="text-sm" data-testid="erasure-report">
          {done.alreadyErased ? `${done.code} was already erased.` : `Removed: ${Object.entries(done.removed).filter(([, n]) => n > 0).map(([t, n]) => `${n} ${t.replaceAll("_", " ")}`).join(", ") || "nothing recorded"}.`}
          {done.supersededExports.length > 0 ? ` Superseded archive(s): ${done.supersededExports.map((id) => `#${id}`).join(", ")}.` : " No archive held them."}
        </p>
      )}
    </section>
  );
}
