"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiSend } from "./api";

/** Clones the study into a new draft of the caller's and opens it. */
export function CloneButton({ studyId }: { studyId: number }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <section className="space-y-1">
      <h2>Clone</h2>
      <p className="max-w-prose text-sm">A new draft with this study&apos;s information, design, consent text and invitation text, owned by you, without participants, reviews or documents. It needs its own review.</p>
      <button type="button" className="btn-secondary" disabled={busy} onClick={async () => {
        setBusy(true);
        setError(null);
        try {
          const { study } = await apiSend<{ study: { id: number } }>("POST", `/api/studies/${studyId}/clone`);
          router.push(`/studies/${study.id}`);
        } catch (e) {
          setError(e instanceof Error ? e.message : String(e));
          setBusy(false);
        }
      }}>Clone into a new draft</button>
      {error && <p className="field-error" role="alert">{error}</p>}
    </section>
  );
}
