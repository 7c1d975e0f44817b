import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { expect, request, test, type APIRequestContext } from "@playwright/test";
import fc from "fast-check";
import type { Knex } from "knex";
import { apiAs, demo } from "./helpers";
import { dropOwnDatabase, ownDatabase, prepareOwnDatabase, rowCounts } from "./fixtures/own-database";
import { startServer } from "./fixtures/session-server";

// A property-based fuzz of every API route (fast-check): the route files are enumerated as the role
// matrix does, each method a file exports is called by an anonymous client and by a signed-in
// researcher with hostile path parameters, query strings, headers, content types and bodies. The
// server must answer every one without a 5xx, and every 4xx with the error shape
// { error: { code, message } } (the project's API contract, lib/api/respond.ts). next-auth's own
// route keeps its library's answers (redirects, HTML), and the public link's Start is a browser
// form answered with pages (and redirects): both are only held to "no 5xx".
//
// Nothing may be written: the row count of every table is the same after the fuzz as before it.
// Other specs write the shared database meanwhile (two workers), so the fuzz runs against a server
// and a database of its own (the same build, DB_NAME_fuzz seeded with the demo, PORT+50), where
// every table can be counted. One table is left out, by design: rate_limits counts attempts (a
// hostile sign-in must be counted). The count starts after the server's housekeeping has run once
// (it publishes the day's audit head and mails it), so that cannot change it either.

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
type Method = (typeof METHODS)[number];

function routeFiles(dir = "app/api"): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((d) => {
    const p = join(dir, d.name);
    if (d.isDirectory()) return routeFiles(p);
    return d.name === "route.ts" ? [p] : [];
  });
}
const methodsOf = (file: string): Method[] => {
  const text = readFileSync(file, "utf8");
  return METHODS.filter((m) => new RegExp(`export (const|async function|function) ${m}\\b|export \\{[^}]*\\b${m}\\b`).test(text));
};
/** Routes that answer browsers with pages, not the API's error shape. */
const PAGE_ROUTES = new Set(["app/api/auth/[...nextauth]/route.ts", "app/api/public/[token]/route.ts"]);

/**
 * Hostile values for a path parameter: numbers out of range, text, traversal, encodings, long.
 * Never a plausible id (a positive integer below 2^31), so a signed-in fuzz cannot touch the
 * seeded demo that other specs read.
 */
const segment = fc.oneof(
  fc.constantFrom("0", "-1", "2147483648", "99999999999999999999", "1e309", "NaN", "abc", "..", "%2e%2e%2f", "%00", "' OR 1=1 --", "<script>", "null", "[]", "{}", "%E2%80%AE"),
  fc.string({ maxLength: 40 }).map(encodeURIComponent).filter((s) => s.length > 0 && !/^\d+$/.test(s)),
  fc.integer({ min: -2_000_000_000, max: -1 }).map(String),
  fc.constant("x".repeat(3000)),
);
const contentType = fc.constantFrom("application/json", "text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=zz", "application/octet-stream", "application/json; charset=utf-16", "");
const body = fc.oneof(
  fc.json().map((j) => Buffer.from(j)),
  fc.jsonValue().map((v) => Buffer.from(JSON.stringify({ ...(typeof v === "object" && v !== null && !Array.isArray(v) ? v : { value: v }), __proto__: { admin: true }, constructor: { prototype: { x: 1 } } }))),
  fc.string({ maxLength: 200 }).map((s) => Buffer.from(s)),
  fc.uint8Array({ maxLength: 300 }).map((a) => Buffer.from(a)),
  fc.constantFrom(Buffer.from("{"), Buffer.from("null"), Buffer.from("[]"), Buffer.from('{"a":' + "[".repeat(5000) + "]".repeat(5000) + "}"), Buffer.from("a=1&a=2&b[c]=3"), Buffer.alloc(0)),
);
const query = fc.constantFrom("", "?id=-1", "?page=NaN&limit=1e9", "?format=../../etc/passwd", "?q=%00", `?x=${"y".repeat(2000)}`);
const extraHeaders = fc.constantFrom<Record<string, string>>({}, { "x-forwarded-for": "1.2.3.4, 5.6.7.8" }, { "x-yawpoint-peer": "10.0.0.1" }, { "content-length": "5" }, { accept: "text/html" }, { origin: "http://evil.example" });

/** Tables written by design whatever a request holds (see above). */
const COUNTED_ANYWAY = new Set(["rate_limits"]);

test.describe("API fuzz", () => {
  test.describe.configure({ timeout: 600_000 });
  const clients = new Map<string, APIRequestContext>();
  let server: { url: string; stop: () => void } | null = null;
  let owner: Knex | null = null;
  let dbName = "";
  let before: Record<string, number> = {};
  test.beforeAll(async () => {
    test.setTimeout(300_000);
    const own = prepareOwnDatabase("fuzz", { seed: true });
    dbName = own.name;
    owner = ownDatabase(dbName);
    server = await startServer(Number(process.env.PORT ?? 3100) + 50, { ...own.env, WEB_CONCURRENCY: "1" });
    clients.set("anonymous", await request.newContext({ baseURL: server.url }));
    clients.set("researcher", await apiAs(demo("researcher").email, demo("researcher").password, server.url));
    // the housekeeping's first run (5 s after start) publishes the day's head: counted from after it
    const day = new Date().toISOString().slice(0, 10);
    await expect.poll(async () => (await owner!("audit_head_publications").where({ day }).first()) !== undefined, { timeout: 60_000 }).toBe(true);
    await new Promise((r) => setTimeout(r, 2000)); // its mails to the reviewers
    before = await rowCounts(owner, dbName);
  });
  test.afterAll(async () => {
    for (const c of clients.values()) await c.dispose();
    server?.stop();
    if (owner) {
      await dropOwnDatabase(owner, dbName);
      await owner.destroy();
    }
  });

  const files = routeFiles().sort();
  test("the fuzz reaches every route file", () => {
    expect(files.length).toBeGreaterThan(20);
    expect(files.filter((f) => methodsOf(f).length === 0)).toEqual([]);
  });

  for (const who of ["anonymous", "researcher"] as const) {
    test(`every route answers hostile requests of a${who === "anonymous" ? "n anonymous client" : " signed-in researcher"} with a 4xx of the error shape or a success, never a 5xx`, async () => {
      const failures: string[] = [];
      for (const file of files) {
        const template = file.replace(/^app/, "").replace(/\/route\.ts$/, "");
        for (const method of methodsOf(file)) {
          await fc.assert(
            fc.asyncProperty(fc.array(segment, { minLength: 4, maxLength: 4 }), query, contentType, body, extraHeaders, async (segs, q, type, data, headers) => {
              let i = 0;
              const path = template.replace(/\[\.\.\.[^\]]+\]|\[[^\]]+\]/g, () => segs[i++ % segs.length]!) + q;
              const res = await clients.get(who)!.fetch(path, {
                method, headers: { ...headers, ...(type ? { "content-type": type } : {}) }, data: method === "GET" ? undefined : data, maxRedirects: 0, failOnStatusCode: false,
              });
              const status = res.status();
              const tag = `${who} ${method} ${path.slice(0, 120)} [${type}] → ${status}`;
              if (status >= 500) failures.push(tag);
              else if (status >= 400 && !PAGE_ROUTES.has(file)) {
                const parsed = await res.json().catch(() => null) as { error?: { code?: unknown; message?: unknown } } | null;
                if (typeof parsed?.error?.code !== "string" || typeof parsed.error.message !== "string") failures.push(`${tag}: not the error shape`);
              }
              return true;
            }),
            { numRuns: 5, seed: 14 },
          );
        }
      }
      expect(failures).toEqual([]);
    });
  }

  test("nothing was written: every table holds as many rows as before the fuzz", async () => {
    const after = await rowCounts(owner!, dbName);
    expect(Object.keys(after).length).toBeGreaterThan(20);
    const changed = Object.keys({ ...before, ...after }).filter((t) => !COUNTED_ANYWAY.has(t) && before[t] !== after[t]).map((t) => `${t}: ${before[t]} → ${after[t]}`);
    expect(changed).toEqual([]);
  });
});
