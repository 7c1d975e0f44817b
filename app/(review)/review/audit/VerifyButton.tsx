"use client";

import { useState, useTransition } from "react";
import type { AuditVerification } from "@/lib/data/audit";
import { verifyAuditAction } from "./actions";

export function VerifyButton() {
  const [result, setResult] = useState<AuditVerification | null>(null);
  const [pending, start] = useTransition();
  return (
    <div className="flex flex-wrap items-center gap-3">
      <button className="btn" disabled={pending} onClick={() => start(async () => setResult(await verifyAuditAction()))}>Verify the chain</button>
      {result && (
        <p role="status" className="text-sm">
          {result.intact
            ? <><strong>Intact</strong>: all {result.entries} entries match their hashes.</>
            : <><strong>Broken</strong> at entry {result.firstBrokenId}: {result.reason}.</>}
        </p>
      )}
    </div>
  );
}
