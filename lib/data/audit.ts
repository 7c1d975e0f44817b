import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import type { Knex } from "knex";
import type { AuditRow } from "./rows";

export const GENESIS_HASH = "0".repeat(64);

export type AuditEntryInput = {
  actorUserId: number | null;
  actorLabel: string;
  action: string;
  studyId?: number | null;
  details?: Record<string, unknown>;
};

/** The canonical JSON (RFC 8785) of an entry's content, the part the hash covers besides prev_hash. */
export function auditCanonical(e: { at: Date; actorUserId: number | null; actorLabel: string; action: string; studyId: number | null; details: unknown }): string {
  const text = canonicalize({
    at: e.at.toISOString(),
    actorUserId: e.actorUserId,
    actorLabel: e.actorLabel,
    action: e.action,
    studyId: e.studyId,
    details: e.details,
  });
  if (text === undefined) throw new Error("auditCanonical: entry is not serialisable");
  return text;
}

/** hash = SHA-256(prev_hash ‖ canonical JSON), hex. */
export function auditHash(prevHash: string, canonical: string): string {
  return createHash("sha256").update(prevHash + canonical, "utf8").digest("hex");
}

/**
 * Appends one entry to the append-only audit log, chained to the previous entry's hash.
 * Serialised with a named lock held on one connection until the insert has committed, so
 * concurrent appends can neither fork the chain nor read a head that is not yet committed.
 */
export async function appendAudit(db: Knex, entry: AuditEntryInput): Promise<void> {
  const conn: unknown = await db.client.acquireConnection();
  try {
    const [lockRows] = (await db.raw("SELECT GET_LOCK('yawpoint_audit', 20) AS got").connection(conn)) as [{ got: number | null }[]];
    if (lockRows[0]?.got !== 1) throw new Error("appendAudit: the audit log is busy; try again");
    try {
      const last = await db<AuditRow>("audit_log").connection(conn).orderBy("id", "desc").first("hash");
      const prevHash = last?.hash ?? GENESIS_HASH;
      const at = new Date(); // millisecond precision, what DATETIME(3) stores
      const content = {
        at,
        actorUserId: entry.actorUserId,
        actorLabel: entry.actorLabel,
        action: entry.action,
        studyId: entry.studyId ?? null,
        details: entry.details ?? {},
      };
      const hash = auditHash(prevHash, auditCanonical(content));
      // autocommit: the row is committed before the lock is released
      await db("audit_log").connection(conn).insert({
        at,
        actor_user_id: content.actorUserId,
        actor_label: content.actorLabel,
        action: content.action,
        study_id: content.studyId,
        details: JSON.stringify(content.details),
        prev_hash: prevHash,
        hash,
      });
    } finally {
      await db.raw("SELECT RELEASE_LOCK('yawpoint_audit')").connection(conn);
    }
  } finally {
    await db.client.releaseConnection(conn);
  }
}

export type AuditVerification = { intact: true; entries: number } | { intact: false; entries: number; firstBrokenId: number; reason: string };

function parseDetails(details: unknown): unknown {
  return typeof details === "string" ? JSON.parse(details) : details;
}

/** Recomputes the whole chain; names the first entry whose link or content does not match. */
export async function verifyAuditChain(db: Knex): Promise<AuditVerification> {
  let prev = GENESIS_HASH;
  let count = 0;
  const rows = await db<AuditRow>("audit_log").orderBy("id", "asc");
  for (const row of rows) {
    count++;
    if (row.prev_hash !== prev) return { intact: false, entries: rows.length, firstBrokenId: row.id, reason: "its link to the previous entry does not match" };
    const canonical = auditCanonical({
      at: row.at,
      actorUserId: row.actor_user_id,
      actorLabel: row.actor_label,
      action: row.action,
      studyId: row.study_id,
      details: parseDetails(row.details),
    });
    if (auditHash(prev, canonical) !== row.hash) return { intact: false, entries: rows.length, firstBrokenId: row.id, reason: "its content does not match its hash" };
    prev = row.hash;
  }
  return { intact: true, entries: count };
}

export type AuditEntry = { id: number; at: Date; actor: string; action: string; studyId: number | null; details: unknown; hash: string };

export async function listAudit(db: Knex, options: { studyId?: number; limit?: number } = {}): Promise<AuditEntry[]> {
  const q = db<AuditRow>("audit_log").orderBy("id", "desc").limit(options.limit ?? 200);
  if (options.studyId !== undefined) q.where({ study_id: options.studyId });
  const rows = await q;
  return rows.map((r) => ({ id: r.id, at: r.at, actor: r.actor_label, action: r.action, studyId: r.study_id, details: parseDetails(r.details), hash: r.hash }));
}
