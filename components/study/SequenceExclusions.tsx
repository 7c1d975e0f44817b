"use client";

import { useState } from "react";
import { apiSend } from "./api";
import { ActionMessageView, useAction } from "./useAction";

export type SequenceRow = { conditionIndex: number; condition: string; block: number; sequence: number; movements: number; errorRate: number | null; flags: string[]; exclusionId: number | null; reason: string | null };

/**
 * One participant's exclusions: the whole participant, or single sequences (the data-quality
 * warnings beside each sequence suggest candidates). Reasons are reported with the results and in
 * archives; every change is audit-logged and can be taken back.
 */
export function SequenceExclusions({ studyId, participantId, code, sequences, participantExclusion, canEdit }: {
  studyId: number; participantId: number; code: string; sequences: SequenceRow[]; participantExclusion: { id: number; reason: string } | null; canEdit: boolean;
}) {
  const { msg, act } = useAction();
  const [reasons, setReasons] = useState<Record<string, string>>({});
  const [whole, setWhole] = useState("");
  const key = (s: SequenceRow) => `${s.conditionIndex}-${s.block}-${s.sequence}`;
  return (
    <section className="card space-y-3" aria-labelledby="exclusions-heading">
      <h2 id="exclusions-heading">Exclusions</h2>
      {participantExclusion ? (
        <p className="notice">{code} is excluded: {participantExclusion.reason}.{" "}
          {canEdit && <button type="button" className="btn-secondary" onClick={() => void act(() => apiSend("DELETE", `/api/studies/${studyId}/exclusions/${participantExclusion.id}`), "The exclusion is taken back.")}>Take back</button>}
        </p>
      ) : canEdit && (
        <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => {
          e.preventDefault();
          void act(() => apiSend("POST", `/api/studies/${studyId}/exclusions`, { scope: "participant", participantId, reason: whole }), `${code} is excluded.`);
        }}>
          <div className="min-w-[18rem] flex-1"><label htmlFor="exclude-participant">Exclude the whole participant: reason</label><input id="exclude-participant" className="input" value={whole} onChange={(e) => setWhole(e.target.value)} /></div>
          <button className="btn-secondary">Exclude {code}</button>
        </form>
      )}
      <table aria-label="Sequences">
        <thead><tr><th>Condition</th><th>Block</th><th>Sequence</th><th>Movements</th><th>Error rate</th><th>Data quality</th><th>Exclusion</th></tr></thead>
        <tbody>
          {sequences.map((s) => (
            <tr key={key(s)}>
              <td>{s.condition}</td><td>{s.block}</td><td>{s.sequence}</td><td>{s.movements}</td>
              <td>{s.errorRate === null ? "—" : `${Math.round(s.errorRate * 100)} %`}</td>
              <td>{s.flags.length ? s.flags.join("; ") : "no warnings"}</td>
              <td>
                {s.exclusionId !== null ? (
                  <>excluded: {s.reason} {canEdit && <button type="button" className="btn-secondary" onClick={() => void act(() => apiSend("DELETE", `/api/studies/${studyId}/exclusions/${s.exclusionId}`), "The exclusion is taken back.")}>Take back</button>}</>
                ) : canEdit && !participantExclusion ? (
                  <form className="flex gap-1" onSubmit={(e) => {
                    e.preventDefault();
                    void act(() => apiSend("POST", `/api/studies/${studyId}/exclusions`, { scope: "sequence", participantId, conditionIndex: s.conditionIndex, block: s.block, sequence: s.sequence, reason: reasons[key(s)] ?? s.flags[0] ?? "" }), "The sequence is excluded.");
                  }}>
                    <input className="input w-48" placeholder="reason" aria-label={`Reason to exclude ${s.condition}, block ${s.block}, sequence ${s.sequence}`} value={reasons[key(s)] ?? s.flags[0] ?? ""} onChange={(e) => setReasons({ ...reasons, [key(s)]: e.target.value })} />
                    <button className="btn-secondary">Exclude</button>
                  </form>
                ) : "—"}
              </td>
            </tr>
          ))}
          {sequences.length === 0 && <tr><td colSpan={7}>No measured sequences yet.</td></tr>}
        </tbody>
      </table>
      <ActionMessageView msg={msg} />
    </section>
  );
}
