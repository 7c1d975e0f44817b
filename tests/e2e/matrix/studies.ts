import { expect, type APIRequestContext } from "@playwright/test";
import type { Clients, Entry } from "./types";

const unique = () => `${Date.now()}${Math.floor(Math.random() * 1e6)}`;

/** A valid 2 × 2 design (technique × gain), our own invented values. */
export const MATRIX_DESIGN = {
  factors: [
    { name: "technique", levels: [{ label: "motion", config: { technique: "motion" } }, { label: "stick", config: { technique: "stick" } }] },
    { name: "gain", levels: [{ label: "gain 3", config: { gain: 3 } }, { label: "gain 6", config: { gain: 6 } }] },
  ],
  task: { type: "ring", displayMode: "view", unit: "deg-view", amplitudes: [20, 40], widths: [2, 4], targetsPerRing: 9 },
  counterbalancing: { method: "williams", seed: 1 },
  plannedParticipants: 8,
};

export const MATRIX_CONSENT =
  "## Purpose\nWe study aiming by turning a phone.\n\n## Procedures\nYou point at targets. Duration: about 25 minutes.\n\n" +
  "## Risks and discomforts\nWrist strain, motion sickness, flashing highlights.\n\n## Benefits\nNone directly.\n\n## Compensation\nA voucher.\n\n" +
  "## Confidentiality\nData are pseudonymous.\n\n## Voluntary participation\nYou may withdraw at any time.\n\n## Contact\nlab@harbourview-lab.example\n";

/** A tiny PDF (starts with the %PDF magic bytes). */
export const TINY_PDF = Buffer.from("%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n");

async function ok(res: Promise<import("@playwright/test").APIResponse>, what: string): Promise<unknown> {
  const r = await res;
  expect(r.status(), `${what}: ${await r.text()}`).toBeLessThan(300);
  return r.headers()["content-type"]?.includes("json") ? r.json() : r.text();
}

/** Creates a study and walks it to `stage` through the API (researcher = the demo owner). */
export async function studyAt(researcher: APIRequestContext, reviewer: APIRequestContext, stage: "draft" | "ready" | "in_review" | "approved" | "recruiting", title = `Matrix study ${unique()}`): Promise<number> {
  const { study } = (await ok(researcher.post("/api/studies", { data: { title, summary: "made by a test" } }), "create")) as { study: { id: number } };
  if (stage === "draft") return study.id;
  await ok(researcher.put(`/api/studies/${study.id}/design`, { data: MATRIX_DESIGN }), "design");
  await ok(researcher.post(`/api/studies/${study.id}/consent`, { data: { body: MATRIX_CONSENT } }), "consent");
  if (stage === "ready") return study.id;
  await ok(researcher.post(`/api/studies/${study.id}/submit`), "submit");
  if (stage === "in_review") return study.id;
  await ok(reviewer.post(`/api/review/${study.id}/decision`, { data: { decision: "approve", comment: "" } }), "approve");
  if (stage === "approved") return study.id;
  await ok(researcher.post(`/api/studies/${study.id}/recruitment`, { data: { action: "open" } }), "open");
  return study.id;
}

const ids = { draft: 0, ready: 0, inReview: 0, toDecide: 0, approved: 0, recruiting: 0, document: 0 };

export async function setup(clients: Clients): Promise<void> {
  const researcher = clients.get("researcher")!;
  const reviewer = clients.get("reviewer")!;
  ids.draft = await studyAt(researcher, reviewer, "draft");
  ids.ready = await studyAt(researcher, reviewer, "ready");
  ids.inReview = await studyAt(researcher, reviewer, "in_review");
  ids.toDecide = await studyAt(researcher, reviewer, "in_review");
  ids.approved = await studyAt(researcher, reviewer, "approved");
  ids.recruiting = await studyAt(researcher, reviewer, "recruiting");
  const up = (await ok(researcher.post(`/api/studies/${ids.recruiting}/documents`, { multipart: { kind: "approval_letter", file: { name: "letter.pdf", mimeType: "application/pdf", buffer: TINY_PDF } } }), "upload")) as { document: { id: number } };
  ids.document = up.document.id;
}

/** A level to try: a motion condition at gain 3 on a cursor ring (our own values). */
const TRY_BODY = {
  label: "motion / gain 3",
  config: { technique: "motion", gain: 3 },
  task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [300], widths: [40], targetsPerRing: 9, selection: "tap", dwellMs: 600, trialTimeLimitMs: 10000 },
};

export const ENTRIES: Record<string, Entry> = {
  "app/api/studies/[id]/route.ts": {
    calls: [
      { method: "GET", path: () => `/api/studies/${ids.inReview}`, allowed: ["researcher", "reviewer"] },
      { method: "PATCH", path: () => `/api/studies/${ids.draft}`, body: () => ({ title: `Renamed ${unique()}`, summary: "s", protocolNumber: "X-1" }), allowed: ["researcher"] },
    ],
  },
  "app/api/studies/[id]/design/route.ts": { calls: [{ method: "PUT", path: () => `/api/studies/${ids.draft}/design`, body: () => MATRIX_DESIGN, allowed: ["researcher"] }] },
  "app/api/studies/[id]/try/route.ts": { calls: [{ method: "POST", path: () => `/api/studies/${ids.draft}/try`, body: () => TRY_BODY, allowed: ["researcher"] }] },
  "app/api/studies/[id]/team/route.ts": {
    calls: [
      { method: "GET", path: () => `/api/studies/${ids.draft}/team`, allowed: ["researcher"] },
      { method: "POST", path: () => `/api/studies/${ids.draft}/team`, body: () => ({ email: "priya@harbourview-lab.example", role: "viewer" }), allowed: ["researcher"] },
    ],
  },
  "app/api/studies/[id]/consent/route.ts": {
    calls: [
      { method: "POST", path: () => `/api/studies/${ids.draft}/consent`, body: () => ({ body: `${MATRIX_CONSENT}\n${unique()}` }), allowed: ["researcher"] },
      { method: "GET", path: () => `/api/studies/${ids.inReview}/consent`, allowed: ["researcher", "reviewer"] },
    ],
  },
  "app/api/studies/[id]/documents/route.ts": {
    calls: [
      { method: "POST", path: () => `/api/studies/${ids.draft}/documents`, multipart: () => ({ kind: "protocol", file: { name: "p.pdf", mimeType: "application/pdf", buffer: TINY_PDF } }), allowed: ["researcher"] },
      { method: "GET", path: () => `/api/studies/${ids.recruiting}/documents`, allowed: ["researcher", "reviewer"] },
    ],
  },
  "app/api/documents/[id]/route.ts": { calls: [{ method: "GET", path: () => `/api/documents/${ids.document}`, allowed: ["researcher", "reviewer"] }] },
  "app/api/studies/[id]/submit/route.ts": { calls: [{ method: "POST", path: () => `/api/studies/${ids.ready}/submit`, allowed: ["researcher"] }] },
  "app/api/review/[id]/decision/route.ts": { calls: [{ method: "POST", path: () => `/api/review/${ids.toDecide}/decision`, body: () => ({ decision: "return", comment: "Please name the board's contact." }), allowed: ["reviewer"] }] },
  "app/api/studies/[id]/recruitment/route.ts": {
    calls: [
      { method: "GET", path: () => `/api/studies/${ids.approved}/recruitment`, allowed: ["researcher", "reviewer"] },
      { method: "POST", path: () => `/api/studies/${ids.approved}/recruitment`, body: () => ({ action: "settings", participantCap: 40, publicLink: true }), allowed: ["researcher"] },
    ],
  },
  "app/api/studies/[id]/invitations/route.ts": {
    calls: [
      { method: "POST", path: () => `/api/studies/${ids.recruiting}/invitations`, body: () => ({ mode: "links", count: 2 }), allowed: ["researcher"] },
      { method: "GET", path: () => `/api/studies/${ids.recruiting}/invitations`, allowed: ["researcher", "reviewer"] },
    ],
  },
};
