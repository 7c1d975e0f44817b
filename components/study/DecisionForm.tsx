"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiSend } from "./api";

/** The reviewer's decision: approve, or return with a comment. */
export function DecisionForm({ studyId }: { studyId: number }) {
  const router = useRouter();
  const [comment, setComment] = useState("");
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  const decide = async (decision: "approve" | "return") => {
    try {
      await apiSend("POST", `/api/review/${studyId}/decision`, { decision, comment });
      setMsg({ ok: true, text: decision === "approve" ? "Approved." : "Returned to the researchers." });
      router.refresh();
    } catch (e) {
      setMsg({ ok: false, text: e instanceof Error ? e.message : String(e) });
    }
  };
  return (
    <div className="card max-w-xl space-y-2">
      <h2>Decision</h2>
      <label htmlFor="decision-comment">Comment (required when returning)</label>
      <textarea id="decision-comment" className="input" rows={4} value={comment} onChange={(e) => setComment(e.target.value)} />
      <div className="flex gap-2">
        <button type="button" className="btn" onClick={() => decide("approve")}>Approve</button>
        <button type="button" className="btn-secondary" onClick={() => decide("return")}>Return with comment</button>
      </div>
      {msg && <p className={msg.ok ? "notice" : "field-error"} role={msg.ok ? "status" : "alert"}>{msg.text}</p>}
    </div>
  );
}
