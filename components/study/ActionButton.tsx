"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiSend } from "./api";

/** A button that sends one JSON call and shows the server's answer in words. */
export function ActionButton({ url, body, label, done, secondary }: { url: string; body?: unknown; label: string; done: string; secondary?: boolean }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  return (
    <div className="space-y-1">
      <button type="button" className={secondary ? "btn-secondary" : "btn"} disabled={busy} onClick={async () => {
        setBusy(true);
        try {
          await apiSend("POST", url, body);
          setMsg({ ok: true, text: done });
          router.refresh();
        } catch (e) {
          setMsg({ ok: false, text: e instanceof Error ? e.message : String(e) });
        } finally {
          setBusy(false);
        }
      }}>{label}</button>
      {msg && <p className={msg.ok ? "notice" : "field-error"} role={msg.ok ? "status" : "alert"}>{msg.text}</p>}
    </div>
  );
}
