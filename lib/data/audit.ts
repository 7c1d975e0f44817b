import { createHmac } from "node:crypto";
import canonicalize from "canonicalize";
import type { Knex } from "knex";
import type { Queryable } from "@/lib/db";
import { env } from "@/lib/env";
import type { AuditRow } from "./rows";

export const GENESIS_HASH = "0".repeat(64);

export type AuditEntryInput = {
  actorUserId: number | null;
  actorLabel: string;
  action: string;
  studyId?: number | null;
  details?: Record<string, unknown>;
};

/** The canonical JSON (RFC 8785) of an entry's content, the part the MAC covers besides prev_hash. */
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

/**
 * An entry's hash (auditHash): HMAC-SHA-256 (RFC 2104, FIPS 180-4) under the audit key over
 * prev_hash ‖ canonical JSON, hex. The key (AUDIT_KEY) lives outside the database, so whoever can
 * write the database but does not hold the key cannot forge or re-chain an entry.
 * Cost: O(length). @throws never.
 * @example auditHash("Jefe", "what do ya want ", "for nothing?") // "5bdcc146…" (RFC 4231 test case 2)
 */
export function auditHash(key: string, prevHash: string, canonical: string): string {
  return createHmac("sha256", Buffer.from(key, "utf8")).update(prevHash + canonical, "utf8").digest("hex");
}

const isTransaction = (q: Queryable): q is Knex.Transaction => (q as Knex.Transaction).isTransaction === true;

type HeadRow = { last_id: number | string; hash: string; entries: number | string };

/**
 * Appends one entry to the append-only audit log, chained to the previous entry.
 *
 * Pass the transaction of the action being recorded: the entry then commits with the action or
 * not at all. The head row (audit_head) is locked until that transaction ends, so concurrent
 * appends queue instead of forking the chain; append last in a transaction, after the action's own
 * row locks, so every transaction takes its locks in the same order. Given the knex instance
 * instead, the entry is appended in a transaction of its own.
 * @throws when the head row is missing (migrations not run) or the database refuses.
 */
export async function appendAudit(q: Queryable, entry: AuditEntryInput, key: string = env.AUDIT_KEY): Promise<void> {
  if (isTransaction(q)) return appendWithin(q, entry, key);
  await q.transaction((trx) => appendWithin(trx, entry, key));
}

async function appendWithin(trx: Knex.Transaction, entry: AuditEntryInput, key: string): Promise<void> {
  const head = await trx("audit_head").where({ id: 1 }).forUpdate().first<HeadRow | undefined>("last_id", "hash", "entries");
  if (!head) throw new Error("appendAudit: the audit head is missing; run the migrations");
  const at = new Date(); // millisecond precision, what DATETIME(3) stores
  const content = {
    at,
    actorUserId: entry.actorUserId,
    actorLabel: entry.actorLabel.slice(0, 120),
    action: entry.action,
    studyId: entry.studyId ?? null,
    details: entry.details ?? {},
  };
  const hash = auditHash(key, head.hash, auditCanonical(content));
  const [id] = await trx("audit_log").insert({
    at,
    actor_user_id: content.actorUserId,
    actor_label: content.actorLabel,
    action: content.action,
    study_id: content.studyId,
    details: JSON.stringify(content.details),
    prev_hash: head.hash,
    hash,
  });
  await trx("audit_head").where({ id: 1 }).update({ last_id: Number(id), hash, entries: Number(head.entries) + 1 });
}

export type AuditHead = { lastId: number; hash: string; entries: number };

/** The chain's head as it stands (the newest entry's id and hash), for publishing and checking. */
export async function fetchAuditHead(q: Queryable): Promise<AuditHead> {
  const head = await q("audit_head").where({ id: 1 }).first<HeadRow | undefined>("last_id", "hash", "entries");
  if (!head) throw new Error("fetchAuditHead: the audit head is missing; run the migrations");
  return { lastId: Number(head.last_id), hash: head.hash, entries: Number(head.entries) };
}

export type AuditVerification =
  | { intact: true; entries: number; head: { lastId: number; hash: string } }
  | { intact: false; entries: number; firstBrokenId: number; reason: string };

function parseDetails(details: unknown): unknown {
  return typeof details === "string" ? JSON.parse(details) : details;
}

/** Rows read per query while verifying: the chain is never held in memory whole. */
export const VERIFY_PAGE = 1000;

/**
 * Recomputes the chain (verifyAuditChain), page by page in id order, up to the head as it stood
 * when verification began; names the first entry whose link or MAC does not match, and also
 * reports a chain that ends before its head (entries removed from the end) or holds a different
 * number of entries. `kept` are heads published earlier (id and hash, e.g. from the daily mail):
 * each must still be in the chain, unchanged, which shows a rewrite even by someone who also
 * moved the head.
 */
export async function verifyAuditChain(q: Queryable, options: { key?: string; kept?: readonly { lastId: number; hash: string }[] } = {}): Promise<AuditVerification> {
  const key = options.key ?? env.AUDIT_KEY;
  const head = await fetchAuditHead(q);
  const kept = new Map((options.kept ?? []).map((k) => [k.lastId, k.hash]));
  let prev = GENESIS_HASH;
  let count = 0;
  let lastId = 0;
  for (;;) {
    const rows = await q<AuditRow>("audit_log").where("id", ">", lastId).andWhere("id", "<=", head.lastId).orderBy("id", "asc").limit(VERIFY_PAGE);
    for (const row of rows) {
      count++;
      const broken = (reason: string): AuditVerification => ({ intact: false, entries: count, firstBrokenId: Number(row.id), reason });
      if (row.prev_hash !== prev) return broken("its link to the previous entry does not match");
      const canonical = auditCanonical({ at: row.at, actorUserId: row.actor_user_id, actorLabel: row.actor_label, action: row.action, studyId: row.study_id, details: parseDetails(row.details) });
      if (auditHash(key, prev, canonical) !== row.hash) return broken("its content does not match its hash");
      const published = kept.get(Number(row.id));
      if (published !== undefined && published !== row.hash) return broken("it differs from the head published for it");
      kept.delete(Number(row.id));
      prev = row.hash;
      lastId = Number(row.id);
    }
    if (rows.length < VERIFY_PAGE) break;
  }
  if (lastId !== head.lastId || prev !== head.hash) {
    return { intact: false, entries: count, firstBrokenId: lastId + 1, reason: `the chain ends at entry ${lastId}, but its head names entry ${head.lastId}` };
  }
  if (count !== head.entries) return { intact: false, entries: count, firstBrokenId: head.lastId, reason: `the chain holds ${count} entries, but its head counts ${head.entries}` };
  for (const [id] of kept) return { intact: false, entries: count, firstBrokenId: id, reason: "an entry named by a published head is missing" };
  return { intact: true, entries: count, head: { lastId: head.lastId, hash: head.hash } };
}

export type AuditEntry = { id: number; at: Date; actor: string; action: string; studyId: number | null; details: unknown; hash: string };

export async function listAudit(q: Queryable, options: { studyId?: number; limit?: number } = {}): Promise<AuditEntry[]> {
  const query = q<AuditRow>("audit_log").orderBy("id", "desc").limit(options.limit ?? 200);
  if (options.studyId !== undefined) query.where({ study_id: options.studyId });
  const rows = await query;
  return rows.map((r) => ({ id: r.id, at: r.at, actor: r.actor_label, action: r.action, studyId: r.study_id, details: parseDetails(r.details), hash: r.hash }));
}
