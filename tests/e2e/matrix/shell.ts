import { readFileSync } from "node:fs";
import type { Clients, Entry } from "./types";

const goodTable = () => ({ file: { name: "good.csv", mimeType: "text/csv", buffer: readFileSync("tests/fixtures/analysis/good.csv") } });
let importId = 0;

const unique = () => `${Date.now()}${Math.floor(Math.random() * 1e6)}`;
let priyaId = 0;
let demoStudyId = 0;

export async function setup(clients: Clients): Promise<void> {
  const users = (await (await clients.get("admin")!.get("/api/admin/users")).json()) as { users: { id: number; email: string }[] };
  priyaId = users.users.find((u) => u.email.startsWith("priya@"))!.id;
  const studies = (await (await clients.get("researcher")!.get("/api/studies")).json()) as { studies: { id: number }[] };
  demoStudyId = studies.studies.at(-1)!.id;
  const upload = await clients.get("researcher")!.post("/api/analyses", { multipart: goodTable() });
  importId = ((await upload.json()) as { id: number }).id;
}

export const ENTRIES: Record<string, Entry> = {
  "app/api/health/route.ts": { public: true, note: "liveness for monitors; reveals nothing" },
  "app/api/auth/[...nextauth]/route.ts": { public: true, note: "sign-in itself" },
  "app/api/me/route.ts": { calls: [{ method: "GET", path: "/api/me", allowed: ["admin", "researcher", "reviewer"] }] },
  "app/api/studies/route.ts": {
    calls: [
      { method: "GET", path: "/api/studies", allowed: ["researcher"] },
      { method: "POST", path: "/api/studies", body: () => ({ title: `Matrix study ${unique()}`, summary: "created by the role matrix" }), allowed: ["researcher"] },
    ],
  },
  "app/api/studies/[id]/route.ts": { calls: [{ method: "GET", path: () => `/api/studies/${demoStudyId}`, allowed: ["researcher"] }] },
  "app/api/admin/users/route.ts": {
    calls: [
      { method: "GET", path: "/api/admin/users", allowed: ["admin"] },
      { method: "POST", path: "/api/admin/users", body: () => ({ email: `matrix.${unique()}@harbourview-lab.example`, name: "Matrix Person", role: "reviewer" }), allowed: ["admin"] },
    ],
  },
  "app/api/admin/users/[id]/route.ts": {
    calls: [{ method: "PATCH", path: () => `/api/admin/users/${priyaId}`, body: () => ({ role: "researcher", active: true }), allowed: ["admin"] }],
  },
  "app/api/admin/mail/route.ts": { calls: [{ method: "GET", path: "/api/admin/mail", allowed: ["admin"] }] },
  "app/api/review/queue/route.ts": { calls: [{ method: "GET", path: "/api/review/queue", allowed: ["reviewer"] }] },
  "app/api/analyses/route.ts": {
    calls: [
      { method: "GET", path: "/api/analyses", allowed: ["researcher"] },
      { method: "POST", path: "/api/analyses", multipart: goodTable, allowed: ["researcher"] },
    ],
  },
  "app/api/analyses/[id]/route.ts": { calls: [{ method: "GET", path: () => `/api/analyses/${importId}`, allowed: ["researcher"] }] },
  "app/api/audit/verify/route.ts": { calls: [{ method: "GET", path: "/api/audit/verify", allowed: ["reviewer"] }] },
  "app/api/audit/head/route.ts": { calls: [{ method: "GET", path: "/api/audit/head", allowed: ["reviewer"] }] },
};
