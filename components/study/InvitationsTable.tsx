"use client";

import { apiSend } from "./api";
import { ActionMessageView, useAction } from "./useAction";

export type InvitationTableRow = { participantId: number; code: string; source: string; status: string; created: string; sentCount: number | null; lastSent: string | null; revoked: boolean; email: string | null };

/** Invitations with their history; re-send, remind and revoke. Addresses appear for the owner alone. */
export function InvitationsTable({ studyId, rows, canEdit, isOwner, recruiting }: { studyId: number; rows: InvitationTableRow[]; canEdit: boolean; isOwner: boolean; recruiting: boolean }) {
  const { msg, act: run } = useAction();
  const act = (r: InvitationTableRow, action: "resend" | "remind" | "revoke", done: string) => run(() => apiSend("POST", `/api/studies/${studyId}/invitations/${r.participantId}`, { action }), done);
  return (
    <section className="space-y-2">
      <h2>Invitations ({rows.length})</h2>
      <ActionMessageView msg={msg} />
      <div className="card overflow-x-auto p-0">
        <table aria-label="Invitations">
          <thead><tr><th>Code</th>{isOwner && <th>Address</th>}<th>Kind</th><th>Status</th><th>Made</th><th>E-mails sent</th>{canEdit && <th>Actions</th>}</tr></thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.participantId} data-code={r.code}>
                <td className="font-mono">{r.code}</td>
                {isOwner && <td>{r.email ?? "—"}</td>}
                <td>{r.source === "email" ? "e-mail" : "link"}</td>
                <td>{r.revoked ? "revoked" : r.status.replace("_", " ")}</td>
                <td>{r.created}</td>
                <td>{r.sentCount === null ? "—" : `${r.sentCount}${r.lastSent ? `, last ${r.lastSent}` : ""}`}</td>
                {canEdit && (
                  <td className="space-x-1 whitespace-nowrap">
                    {!r.revoked && recruiting && r.source === "email" && r.status === "invited" && <button type="button" className="btn-secondary" onClick={() => void act(r, "resend", `The invitation to ${r.code} was sent again.`)}>Re-send</button>}
                    {!r.revoked && recruiting && r.source === "email" && ["invited", "consented", "in_progress"].includes(r.status) && <button type="button" className="btn-secondary" onClick={() => void act(r, "remind", `A reminder went to ${r.code}.`)}>Remind</button>}
                    {!r.revoked && r.status === "invited" && <button type="button" className="btn-secondary" onClick={() => { if (window.confirm(`Revoke ${r.code}? Its link stops working.`)) void act(r, "revoke", `${r.code} is revoked.`); }}>Revoke</button>}
                  </td>
                )}
              </tr>
            ))}
            {rows.length === 0 && <tr><td colSpan={8}>No invitations yet.</td></tr>}
          </tbody>
        </table>
      </div>
    </section>
  );
}
