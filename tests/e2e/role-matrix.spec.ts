import { readdirSync } from "node:fs";
import { join } from "node:path";
import { expect, request, test, type APIRequestContext } from "@playwright/test";
import { apiAsRole, baseURL, type DemoRole } from "./helpers";

/**
 * Every API route file, with the calls that exercise it and the roles allowed. A new route file
 * without an entry here fails the first test: access rules are never left implicit.
 */
type Call = { method: "GET" | "POST" | "PATCH" | "DELETE"; path: string | (() => Promise<string>); body?: () => unknown; allowed: DemoRole[] };
type Entry = { public: true; note: string } | { calls: Call[] };

const unique = () => `${Date.now()}${Math.floor(Math.random() * 1e6)}`;
let priyaId = 0;
let demoStudyId = 0;

export const MATRIX: Record<string, Entry> = {
  "app/api/health/route.ts": { public: true, note: "liveness for monitors; reveals nothing" },
  "app/api/auth/[...nextauth]/route.ts": { public: true, note: "sign-in itself" },
  "app/api/me/route.ts": { calls: [{ method: "GET", path: "/api/me", allowed: ["admin", "researcher", "reviewer"] }] },
  "app/api/studies/route.ts": {
    calls: [
      { method: "GET", path: "/api/studies", allowed: ["researcher"] },
      { method: "POST", path: "/api/studies", body: () => ({ title: `Matrix study ${unique()}`, summary: "created by the role matrix" }), allowed: ["researcher"] },
    ],
  },
  "app/api/studies/[id]/route.ts": { calls: [{ method: "GET", path: async () => `/api/studies/${demoStudyId}`, allowed: ["researcher"] }] },
  "app/api/admin/users/route.ts": {
    calls: [
      { method: "GET", path: "/api/admin/users", allowed: ["admin"] },
      { method: "POST", path: "/api/admin/users", body: () => ({ email: `matrix.${unique()}@harbourview-lab.example`, name: "Matrix Person", role: "reviewer" }), allowed: ["admin"] },
    ],
  },
  "app/api/admin/users/[id]/route.ts": {
    calls: [{ method: "PATCH", path: async () => `/api/admin/users/${priyaId}`, body: () => ({ role: "researcher", active: true }), allowed: ["admin"] }],
  },
  "app/api/admin/mail/route.ts": { calls: [{ method: "GET", path: "/api/admin/mail", allowed: ["admin"] }] },
  "app/api/review/queue/route.ts": { calls: [{ method: "GET", path: "/api/review/queue", allowed: ["reviewer"] }] },
  "app/api/audit/verify/route.ts": { calls: [{ method: "GET", path: "/api/audit/verify", allowed: ["reviewer"] }] },
};

function routeFiles(dir = "app/api"): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((d) => {
    const p = join(dir, d.name);
    if (d.isDirectory()) return routeFiles(p);
    return d.name === "route.ts" ? [p] : [];
  });
}

test("every API route file has an entry in the role matrix", () => {
  const files = routeFiles().sort();
  expect(files.length).toBeGreaterThan(5);
  expect(files.filter((f) => !(f in MATRIX)), "route files missing from MATRIX").toEqual([]);
  expect(Object.keys(MATRIX).filter((f) => !files.includes(f)), "MATRIX entries without a file").toEqual([]);
});

test.describe("role matrix", () => {
  const clients = new Map<DemoRole | "anonymous", APIRequestContext>();

  test.beforeAll(async () => {
    clients.set("anonymous", await request.newContext({ baseURL }));
    for (const role of ["admin", "researcher", "reviewer"] as const) clients.set(role, await apiAsRole(role));
    const users = (await (await clients.get("admin")!.get("/api/admin/users")).json()) as { users: { id: number; email: string }[] };
    priyaId = users.users.find((u) => u.email.startsWith("priya@"))!.id;
    const studies = (await (await clients.get("researcher")!.get("/api/studies")).json()) as { studies: { id: number }[] };
    demoStudyId = studies.studies[0]!.id;
  });
  test.afterAll(async () => {
    for (const c of clients.values()) await c.dispose();
  });

  for (const [file, entry] of Object.entries(MATRIX)) {
    if ("public" in entry) continue;
    for (const call of entry.calls) {
      test(`${call.method} ${typeof call.path === "string" ? call.path : file}: anonymous 401, wrong role 403, right role 2xx`, async () => {
        const path = typeof call.path === "string" ? call.path : await call.path();
        for (const who of ["anonymous", "admin", "researcher", "reviewer"] as const) {
          const res = await clients.get(who)!.fetch(path, { method: call.method, data: call.body?.() });
          const expected = who === "anonymous" ? 401 : call.allowed.includes(who) ? "2xx" : 403;
          if (expected === "2xx") expect(res.status(), `${who} ${call.method} ${path}: ${await res.text()}`).toBeLessThan(300);
          else expect(res.status(), `${who} ${call.method} ${path}`).toBe(expected);
          if (res.status() >= 400) expect(((await res.json()) as { error: { code: string } }).error.code).toBeTruthy();
        }
      });
    }
  }
});
