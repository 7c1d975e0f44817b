import { createHmac } from "node:crypto";
import type { Queryable } from "@/lib/db";
import { env } from "@/lib/env";

/** A limit: at most `max` within each fixed window of `windowMs`. */
export type Limit = { name: string; max: number; windowMs: number };

/** Sign-in attempts per account that may fail in 15 minutes; a success gives its attempt back. */
export const SIGN_IN_ACCOUNT_LIMIT: Limit = { name: "sign-in account", max: 10, windowMs: 15 * 60_000 };
/** Failed sign-ins per client address in 15 minutes (a lab behind one address shares it). */
export const SIGN_IN_ADDRESS_LIMIT: Limit = { name: "sign-in address", max: 100, windowMs: 15 * 60_000 };
/** Password-reset requests per account, and per address, in an hour. */
export const RESET_ACCOUNT_LIMIT: Limit = { name: "reset account", max: 3, windowMs: 60 * 60_000 };
export const RESET_ADDRESS_LIMIT: Limit = { name: "reset address", max: 10, windowMs: 60 * 60_000 };
/**
 * Sequence uploads per session link in a minute (UPLOAD_LIMIT_PER_MINUTE, default 120). A person
 * finishes a sequence every several seconds; a runner catching up after a network outage sends
 * its queue one batch at a time and retries a 429 with backoff, so it loses nothing.
 */
export const uploadLinkLimit = (): Limit => ({ name: "upload link", max: env.UPLOAD_LIMIT_PER_MINUTE, windowMs: 60_000 });
/**
 * Counts a sequence upload against its session link's limit (admitUpload), before the body is
 * read or anything decompressed. @returns null when it may go on, else the seconds to wait.
 */
export async function admitUpload(q: Queryable, participantId: number, now = Date.now()): Promise<number | null> {
  const limit = uploadLinkLimit();
  return (await hitLimit(q, limit, `participant:${participantId}`, now)).within ? null : secondsToNextWindow(limit, now);
}
/**
 * Starts through a study's public link per client address in 10 minutes. Each start makes a
 * participant and an audit entry for someone nobody invited, so a visitor who throws away the
 * visitor cookie cannot flood either; a lab running people one after another on its machines
 * behind one address stays well within it (common practice: a few per minute per address).
 */
export const PUBLIC_START_LIMIT: Limit = { name: "public start", max: 30, windowMs: 10 * 60_000 };
/**
 * Counts a public link's Start against the client address's limit for that study (admitPublicStart).
 * @returns null when it may go on, else the seconds to wait.
 */
export async function admitPublicStart(q: Queryable, studyId: number, address: string, now = Date.now()): Promise<number | null> {
  return (await hitLimit(q, PUBLIC_START_LIMIT, `study:${studyId}:${address}`, now)).within ? null : secondsToNextWindow(PUBLIC_START_LIMIT, now);
}
/** For the messages that quote it. */
export const SIGN_IN_LIMIT = { failures: SIGN_IN_ACCOUNT_LIMIT.max, windowMinutes: SIGN_IN_ACCOUNT_LIMIT.windowMs / 60_000 };

/**
 * The bucket of what is limited (limitBucket): a keyed hash (HMAC-SHA-256 under the session
 * secret) of the limit's name and the key, so the counters hold no e-mail or address.
 */
export function limitBucket(limit: Limit, key: string): string {
  return createHmac("sha256", env.NEXTAUTH_SECRET).update(`${limit.name}\n${key.trim().toLowerCase()}`, "utf8").digest("hex");
}

const windowOf = (limit: Limit, now: number): Date => new Date(Math.floor(now / limit.windowMs) * limit.windowMs);

/**
 * Counts one hit against a limit and says whether it is within (hitLimit): one atomic statement,
 * INSERT … ON DUPLICATE KEY UPDATE hits = LAST_INSERT_ID(hits + 1), whose answer carries the
 * count it wrote (MariaDB: LAST_INSERT_ID(expr) sets the value the statement reports), so of any
 * number of parallel hits exactly `max` are within, in one round trip. Fixed windows.
 * @returns the count including this hit, and whether it is within the limit.
 */
export async function hitLimit(q: Queryable, limit: Limit, key: string, now = Date.now()): Promise<{ count: number; within: boolean }> {
  const [result] = (await q.raw(
    "INSERT INTO rate_limits (bucket, window_start, hits) VALUES (?, ?, LAST_INSERT_ID(1)) ON DUPLICATE KEY UPDATE hits = LAST_INSERT_ID(hits + 1)",
    [limitBucket(limit, key), windowOf(limit, now)],
  )) as [{ insertId: number }];
  const count = Math.max(1, Number(result.insertId));
  return { count, within: count <= limit.max };
}

/** Seconds until the window of a limit that holds `now` ends (for Retry-After). */
export function secondsToNextWindow(limit: Limit, now = Date.now()): number {
  return Math.max(1, Math.ceil((windowOf(limit, now).getTime() + limit.windowMs - now) / 1000));
}

/** Gives one hit back (a sign-in that succeeded was no failure). */
export async function returnHit(q: Queryable, limit: Limit, key: string, now = Date.now()): Promise<void> {
  await q("rate_limits").where({ bucket: limitBucket(limit, key), window_start: windowOf(limit, now) }).andWhere("hits", ">", 0).decrement("hits", 1);
}

/** Whether the limit is used up already, without counting a hit. */
export async function isLimited(q: Queryable, limit: Limit, key: string, now = Date.now()): Promise<boolean> {
  const row = await q("rate_limits").where({ bucket: limitBucket(limit, key), window_start: windowOf(limit, now) }).first<{ hits: number } | undefined>("hits");
  return Number(row?.hits ?? 0) >= limit.max;
}

/** Drops counters of windows that ended more than a day ago (housekeeping). */
export async function sweepRateLimits(q: Queryable, now = Date.now()): Promise<number> {
  return q("rate_limits").where("window_start", "<", new Date(now - 24 * 60 * 60_000)).delete();
}

/** The header scripts/serve.ts sets to the connection's peer address (any such header a client sends is replaced). */
export const PEER_HEADER = "x-yawpoint-peer";

type HeaderSource = Headers | Record<string, string | string[] | undefined>;

/**
 * The client's address (clientAddress), trusting X-Forwarded-For only as far as configured.
 *
 * With `hops` trusted proxies in front (TRUSTED_PROXY_HOPS), each appending the address it
 * received from, the client is the `hops`-th address from the right of [X-Forwarded-For…, peer];
 * addresses further left were written by the client and are ignored. With 0 hops X-Forwarded-For
 * is ignored altogether and the connection's own peer counts. Source: RFC 7239 §5.2 and the
 * de-facto X-Forwarded-For convention (common practice: count trusted hops from the right).
 * Cost: O(header length). @throws never.
 * @example clientAddress(new Headers({ "x-forwarded-for": "198.51.100.9, 203.0.113.5", "x-yawpoint-peer": "10.0.0.2" }), 1) // "203.0.113.5"
 */
export function clientAddress(headers: HeaderSource, hops: number = env.TRUSTED_PROXY_HOPS): string {
  const get = (name: string): string | undefined => {
    if (headers instanceof Headers) return headers.get(name) ?? undefined;
    const v = headers[name];
    return Array.isArray(v) ? v.join(",") : v;
  };
  const peer = get(PEER_HEADER)?.trim() || "unknown";
  if (hops <= 0) return peer;
  const chain = [...(get("x-forwarded-for") ?? "").split(",").map((s) => s.trim()).filter(Boolean), peer];
  return chain[Math.max(0, chain.length - 1 - hops)]!;
}
