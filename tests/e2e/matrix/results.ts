import { FINISHED_STUDY } from "../../../db/seeds/demo-finished-study";
import type { Clients, Entry } from "./types";

let studyId = 0;
let participantId = 0;
let exportId = 0;

/** Finds the finished demo study, one of its participants, and a finished export of it. */
export async function setup(clients: Clients): Promise<void> {
  const researcher = clients.get("researcher")!;
  const studies = (await (await researcher.get("/api/studies")).json()) as { studies: { id: number; title: string }[] };
  studyId = studies.studies.find((s) => s.title === FINISHED_STUDY.title)!.id;
  const results = (await (await researcher.get(`/api/studies/${studyId}/results`)).json()) as { results: { participants: { id: number }[] } };
  participantId = results.results.participants[0]!.id;
  const started = (await (await researcher.post(`/api/studies/${studyId}/exports`, { data: {} })).json()) as { export: { id: number } };
  exportId = started.export.id;
  for (let i = 0; i < 120; i++) {
    const job = (await (await researcher.get(`/api/exports/${exportId}`)).json()) as { export: { status: string } };
    if (job.export.status === "done" || job.export.status === "failed") break;
    await new Promise((r) => setTimeout(r, 250));
  }
}

export const ENTRIES: Record<string, Entry> = {
  "app/api/studies/[id]/results/route.ts": { calls: [{ method: "GET", path: () => `/api/studies/${studyId}/results`, allowed: ["researcher"] }] },
  "app/api/studies/[id]/results/participants/[pid]/route.ts": {
    calls: [{ method: "GET", path: () => `/api/studies/${studyId}/results/participants/${participantId}`, allowed: ["researcher"] }],
  },
  "app/api/studies/[id]/exports/route.ts": {
    calls: [
      { method: "GET", path: () => `/api/studies/${studyId}/exports`, allowed: ["researcher"] },
      { method: "POST", path: () => `/api/studies/${studyId}/exports`, body: () => ({ pseudonyms: "stable" }), allowed: ["researcher"] },
    ],
  },
  "app/api/exports/[exportId]/route.ts": { calls: [{ method: "GET", path: () => `/api/exports/${exportId}`, allowed: ["researcher"] }] },
  "app/api/exports/[exportId]/download/route.ts": { calls: [{ method: "GET", path: () => `/api/exports/${exportId}/download`, allowed: ["researcher"] }] },
  // the owner and the ethics reviewers; editors and viewers are refused too (tests/e2e/results.spec.ts)
  "app/api/studies/[id]/consent-register/route.ts": { calls: [{ method: "GET", path: () => `/api/studies/${studyId}/consent-register`, allowed: ["researcher", "reviewer"] }] },
};
