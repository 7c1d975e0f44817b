"use client";

import { useState, useTransition } from "react";
import type { AuditVerification } from "@/lib/data/audit";
import { verifyAuditAction } from "./actions";

export function VerifyButton() {
  const [result, setResult] = useState<AuditVerification | { error: string } | null>(null);
  const [kept, setKept] = useState("");
  const [pending, start] = useTransition();
  return (
    <div className="space-y-2">
      <label htmlFor="kept-heads">Heads you kept <span className="font-normal text-slate-600">(optional; one <code>entry:hash</code> line each, from the daily mail or a downloaded head)</span></label>
      <textarea id="kept-heads" className="input h-20 w-full max-w-2xl font-mono text-xs" value={kept} onChange={(e) => setKept(e.target.value)} />
      <div className="flex flex-wrap items-center gap-3">
        <button className="btn" disabled={pending} onClick={() => start(async () => setResult(await verifyAuditAction(kept)))}>Verify the chain</button>
        {result && (
          <p role="status" className="text-sm">
            {"error" in result ? <><strong>Not checked</strong>: {result.error}</>
              : result.intact
                ? <><strong>Intact</strong>: all {result.entries} entries match their keyed hashes{kept.trim() ? ", and every head you kept is in the chain" : ""}.</>
                : <><strong>Broken</strong> at entry {result.firstBrokenId}: {result.reason}.</>}
          </p>
        )}
      </div>
    </div>
  );
}
