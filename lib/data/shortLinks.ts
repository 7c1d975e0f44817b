import { z } from "zod";
import type { Queryable } from "@/lib/db";
import { hashToken } from "@/lib/auth/tokens";
import { env } from "@/lib/env";
import { qrDataUrl } from "@/lib/links/qrSvg";
import { newShortCode, normaliseShortCode } from "@/lib/links/shortCode";
import { openWithDataKey, sealWithDataKey } from "@/lib/recruitment/dataKey";

/** What a short link may open. Add a purpose here when a new kind of link is needed. */
export const SHORT_LINK_PURPOSES = ["pilot", "try-level"] as const;
export type ShortLinkPurpose = (typeof SHORT_LINK_PURPOSES)[number];

export const shortLinkInputSchema = z.strictObject({
  purpose: z.enum(SHORT_LINK_PURPOSES),
  /** A path on this server (never another site: a short link is no open redirect). */
  target: z.string().regex(/^\/(?!\/)[^\s\\]*$/, "a path on this server, starting with one /").max(2000),
  /** How long the link works, ms (at most 7 days). */
  ttlMs: z.number().int().min(60_000).max(7 * 24 * 3600_000),
  studyId: z.number().int().positive().nullable().default(null),
  createdBy: z.number().int().positive().nullable().default(null),
});
export type ShortLinkInput = z.input<typeof shortLinkInputSchema>;

export type ShortLink = { code: string; url: string; expiresAt: Date; purpose: ShortLinkPurpose };

/** The short address of a code on the configured public address: /go/<code>. */
export const shortLinkUrl = (code: string) => `${env.NEXTAUTH_URL.replace(/\/$/, "")}/go/${code}`;

/**
 * Makes a short link (createShortLink): a fresh 8-character code whose SHA-256 is stored with the
 * target path (encrypted: a target may hold a session token) and an expiry. Retried on the
 * unlikely clash of two codes. Show the code and its QR code (lib/links/qrSvg.ts) once; it is not
 * kept in clear.
 * @throws ZodError for a target that is not a path on this server or a bad lifetime.
 */
export async function createShortLink(q: Queryable, input: ShortLinkInput, now = new Date()): Promise<ShortLink> {
  const v = shortLinkInputSchema.parse(input);
  const expiresAt = new Date(now.getTime() + v.ttlMs);
  for (let attempt = 0; ; attempt++) {
    const code = newShortCode();
    try {
      await q("short_links").insert({ code_hash: hashToken(code), purpose: v.purpose, target_encrypted: sealWithDataKey(v.target), study_id: v.studyId, created_by: v.createdBy, expires_at: expiresAt });
      return { code, url: shortLinkUrl(code), expiresAt, purpose: v.purpose };
    } catch (e) {
      if ((e as { code?: string }).code !== "ER_DUP_ENTRY" || attempt >= 5) throw e;
    }
  }
}

export type ResolvedShortLink = { ok: true; target: string; purpose: ShortLinkPurpose } | { ok: false; reason: "unknown" | "expired" };

/**
 * Follows a short link (resolveShortLink): the target path of a known, unexpired code (case,
 * spaces and dashes forgiven), counting the visit; otherwise why not.
 */
export async function resolveShortLink(q: Queryable, typed: string, now = new Date()): Promise<ResolvedShortLink> {
  const code = normaliseShortCode(typed);
  if (!code) return { ok: false, reason: "unknown" };
  const row = await q("short_links").where({ code_hash: hashToken(code) }).first<{ id: number; purpose: ShortLinkPurpose; target_encrypted: string; expires_at: Date } | undefined>("id", "purpose", "target_encrypted", "expires_at");
  if (!row) return { ok: false, reason: "unknown" };
  if (row.expires_at.getTime() <= now.getTime()) return { ok: false, reason: "expired" };
  await q("short_links").where({ id: row.id }).increment("opened", 1);
  return { ok: true, target: openWithDataKey(row.target_encrypted), purpose: row.purpose };
}

/** Deletes links that expired more than a day ago (they only ever say "expired"); returns how many. */
export async function purgeExpiredShortLinks(q: Queryable, now = new Date()): Promise<number> {
  return q("short_links").where("expires_at", "<", new Date(now.getTime() - 24 * 3600_000)).delete();
}

/** A short link as a page shows it (components/links/ShortLinkCard.tsx), with its QR code. */
export async function shortLinkView(link: ShortLink): Promise<{ code: string; url: string; expiresAt: string; qrDataUrl: string }> {
  return { code: link.code, url: link.url, expiresAt: link.expiresAt.toISOString(), qrDataUrl: await qrDataUrl(link.url) };
}
