import type { Knex } from "knex";
import { z } from "zod";
import { fetchAuditHead, type AuditHead } from "@/lib/data/audit";
import { auditHeadMail } from "@/lib/mail/templates";
import { sendMail } from "@/lib/mail/send";

/** A head as a reviewer keeps it: "entry:hash", e.g. "1842:9f86d0…". */
export const keptHeadSchema = z.string().trim().regex(/^\d{1,15}:[0-9a-f]{64}$/, "write a kept head as entry:hash (64 hex digits)")
  .transform((s) => { const [id, hash] = s.split(":"); return { lastId: Number(id), hash: hash! }; });

/** Kept heads from text, one per line or separated by commas; blank lines are skipped. @throws ZodError naming a bad line. */
export function parseKeptHeads(text: string): { lastId: number; hash: string }[] {
  return text.split(/[\n,]/).map((l) => l.trim()).filter(Boolean).map((l) => keptHeadSchema.parse(l));
}

/** The line a reviewer keeps for a head. */
export const keptHeadLine = (head: Pick<AuditHead, "lastId" | "hash">): string => `${head.lastId}:${head.hash}`;

/**
 * Publishes today's head of the audit chain (publishAuditHead), once per UTC day whichever server
 * process comes first (the day is the table's key): records it and mails it to every active
 * ethics reviewer, who keeps it outside the system. Mail that fails is logged as failed and the
 * head stays published (the audit page lists it).
 * @returns whether this call published it.
 */
export async function publishAuditHead(db: Knex, now = new Date()): Promise<boolean> {
  const day = now.toISOString().slice(0, 10);
  const head = await fetchAuditHead(db);
  const [result] = (await db.raw("INSERT IGNORE INTO audit_head_publications (day, last_id, hash, entries, published_at) VALUES (?, ?, ?, ?, ?)", [day, head.lastId, head.hash, head.entries, now])) as [{ affectedRows: number }];
  if (result.affectedRows !== 1) return false;
  const reviewers = await db("users").where({ role: "reviewer", active: true }).select<{ email: string; name: string }[]>("email", "name");
  for (const r of reviewers) {
    const mail = auditHeadMail({ name: r.name, day, at: now, head, line: keptHeadLine(head) });
    await sendMail({ to: r.email, ...mail, template: "audit-head" }).catch((e: unknown) => console.error("audit head mail failed", e));
  }
  return true;
}

export type PublishedHead = { day: string; lastId: number; hash: string; entries: number; publishedAt: Date };

/** The heads published so far, newest first. */
export async function listPublishedHeads(db: Knex, limit = 30): Promise<PublishedHead[]> {
  const rows = await db("audit_head_publications").orderBy("day", "desc").limit(limit)
    .select<{ day: Date | string; last_id: number | string; hash: string; entries: number | string; published_at: Date }[]>("day", "last_id", "hash", "entries", "published_at");
  return rows.map((r) => ({ day: typeof r.day === "string" ? r.day : r.day.toISOString().slice(0, 10), lastId: Number(r.last_id), hash: r.hash, entries: Number(r.entries), publishedAt: r.published_at }));
}
