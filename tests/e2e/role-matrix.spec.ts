import { readdirSync } from "node:fs";
import { join } from "node:path";
import { expect, request, test, type APIRequestContext } from "@playwright/test";
import { apiAsRole, baseURL, type DemoRole } from "./helpers";
import type { Clients, Entry } from "./matrix/types";
import { ENTRIES as SHELL, setup as setupShell } from "./matrix/shell";
import { ENTRIES as STUDIES, setup as setupStudies } from "./matrix/studies";
import { ENTRIES as PARTICIPANT, setup as setupParticipant } from "./matrix/participant";
import { ENTRIES as RESULTS, setup as setupResults } from "./matrix/results";
import { ENTRIES as LIFECYCLE, setup as setupLifecycle } from "./matrix/lifecycle";

/**
 * Every API route file, with the calls that exercise it and the roles allowed. A new route file
 * without an entry fails the first test: access rules are never left implicit. Each area keeps
 * its entries in tests/e2e/matrix/<area>.ts.
 */
const MATRIX: Record<string, Entry> = { ...SHELL, ...STUDIES, ...PARTICIPANT, ...RESULTS, ...LIFECYCLE };
const setups = [setupShell, setupStudies, setupParticipant, setupResults, setupLifecycle];

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
  const clients: Clients = new Map<DemoRole | "anonymous", APIRequestContext>();

  test.beforeAll(async () => {
    clients.set("anonymous", await request.newContext({ baseURL }));
    for (const role of ["admin", "researcher", "reviewer"] as const) clients.set(role, await apiAsRole(role));
    for (const s of setups) await s(clients);
  });
  test.afterAll(async () => {
    for (const c of clients.values()) await c.dispose();
  });

  for (const [file, entry] of Object.entries(MATRIX)) {
    if (!("calls" in entry)) continue;
    for (const [i, call] of entry.calls.entries()) {
      test(`${call.method} ${typeof call.path === "string" ? call.path : file} (#${i + 1}): anonymous 401, wrong role 403, right role 2xx`, async () => {
        const path = typeof call.path === "string" ? call.path : await call.path();
        for (const who of ["anonymous", "admin", "researcher", "reviewer"] as const) {
          const res = await clients.get(who)!.fetch(path, { method: call.method, data: call.body?.(), multipart: call.multipart?.() });
          const expected = who === "anonymous" ? 401 : call.allowed.includes(who) ? "2xx" : 403;
          if (expected === "2xx") expect(res.status(), `${who} ${call.method} ${path}: ${await res.text()}`).toBeLessThan(300);
          else expect(res.status(), `${who} ${call.method} ${path}`).toBe(expected);
          if (res.status() >= 400) expect(((await res.json()) as { error: { code: string } }).error.code).toBeTruthy();
        }
      });
    }
  }
});
