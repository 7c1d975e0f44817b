import { expect, type APIRequestContext } from "@playwright/test";
import { MATRIX_CONSENT, studyAt } from "./studies";
import type { Clients, Entry } from "./types";

/** A motion-only 2-level design the simulated participant can run (the shared matrix design has a stick level). */
export const MOTION_DESIGN = {
  baseConfig: { technique: "motion", displayMode: "cursor", pixelsPerDegree: 10 },
  factors: [{ name: "gain", levels: [{ label: "gain 2", config: { gain: 2 } }, { label: "gain 4", config: { gain: 4 } }] }],
  task: { type: "ring", displayMode: "cursor", unit: "px", amplitudes: [200], widths: [40], targetsPerRing: 7, practiceSequences: 0 },
  counterbalancing: { method: "williams", seed: 1 },
  plannedParticipants: 4,
};

const ids = { ready: 0, reviewed: 0, recruiting: 0, invitation: 0, participant: 0, exclusion: 0 };

async function json<T>(res: Promise<import("@playwright/test").APIResponse>, what: string): Promise<T> {
  const r = await res;
  expect(r.status(), `${what}: ${await r.text()}`).toBeLessThan(300);
  return (await r.json()) as T;
}

/** Studies and participants for the lifecycle routes (pilots, amendments, invitations, exclusions). */
export async function setup(clients: Clients): Promise<void> {
  const researcher = clients.get("researcher")!;
  researcherClient = researcher;
  const reviewer = clients.get("reviewer")!;
  ids.ready = await studyAt(researcher, reviewer, "draft");
  await json(researcher.put(`/api/studies/${ids.ready}/design`, { data: MOTION_DESIGN }), "design");
  await json(researcher.post(`/api/studies/${ids.ready}/consent`, { data: { body: MATRIX_CONSENT } }), "consent");
  ids.reviewed = await studyAt(researcher, reviewer, "approved");
  ids.recruiting = await studyAt(researcher, reviewer, "recruiting");
  const csv = await (await researcher.post(`/api/studies/${ids.recruiting}/invitations`, { data: { mode: "links", count: 3 } })).text();
  const codes = csv.trim().split("\n").slice(1).map((l) => l.split(",")[0]!);
  const listed = await json<{ invitations: { participantId: number; code: string }[] }>(researcher.get(`/api/studies/${ids.recruiting}/invitations`), "list");
  ids.invitation = listed.invitations.find((i) => i.code === codes[0])!.participantId;
  ids.participant = listed.invitations.find((i) => i.code === codes[1])!.participantId;
  erasable = codes[2]!;
  const pilot = await json<{ pilot: { code: string } }>(researcher.post(`/api/studies/${ids.ready}/pilots`, { data: { device: "here" } }), "pilot");
  expect(pilot.pilot.code).toMatch(/^P-/);
  ids.exclusion = (await json<{ exclusion: { id: number } }>(researcher.post(`/api/studies/${ids.recruiting}/exclusions`, { data: { scope: "participant", participantId: ids.participant, reason: "made by the role matrix" } }), "exclusion")).exclusion.id;
}

let researcherClient: APIRequestContext | null = null;
let erasable = "";

/** A fresh pilot of the ready study (each allowed call that deletes or changes one consumes it). */
async function pilotId(): Promise<number> {
  return (await json<{ pilot: { id: number } }>(researcherClient!.post(`/api/studies/${ids.ready}/pilots`, { data: { device: "here" } }), "pilot")).pilot.id;
}

export const ENTRIES: Record<string, Entry> = {
  "app/api/studies/[id]/pilots/route.ts": { calls: [{ method: "POST", path: () => `/api/studies/${ids.ready}/pilots`, body: () => ({ device: "phone" }), allowed: ["researcher"] }] },
  "app/api/studies/[id]/pilots/simulated/route.ts": { calls: [{ method: "POST", path: () => `/api/studies/${ids.ready}/pilots/simulated`, body: () => ({ participants: 1, spread: 0.1, include: false }), allowed: ["researcher"] }] },
  "app/api/studies/[id]/pilots/[pid]/route.ts": {
    calls: [
      { method: "PATCH", path: async () => `/api/studies/${ids.ready}/pilots/${await pilotId()}`, body: () => ({ included: true }), allowed: ["researcher"] },
      { method: "DELETE", path: async () => `/api/studies/${ids.ready}/pilots/${await pilotId()}`, allowed: ["researcher"] },
    ],
  },
  "app/api/studies/[id]/clone/route.ts": { calls: [{ method: "POST", path: () => `/api/studies/${ids.reviewed}/clone`, allowed: ["researcher"] }] },
  "app/api/studies/[id]/invitation-text/route.ts": { calls: [{ method: "PUT", path: () => `/api/studies/${ids.ready}/invitation-text`, body: () => ({ text: "We invite you to aim at targets with your phone; taking part is voluntary." }), allowed: ["researcher"] }] },
  "app/api/studies/[id]/invitations/[pid]/route.ts": { calls: [{ method: "POST", path: () => `/api/studies/${ids.recruiting}/invitations/${ids.invitation}`, body: () => ({ action: "revoke" }), allowed: ["researcher"] }] },
  "app/api/studies/[id]/protocol/route.ts": { calls: [{ method: "GET", path: () => `/api/studies/${ids.reviewed}/protocol`, allowed: ["researcher", "reviewer"] }] },
  "app/api/studies/[id]/exclusions/route.ts": {
    calls: [
      { method: "GET", path: () => `/api/studies/${ids.recruiting}/exclusions`, allowed: ["researcher"] },
      // the participant excluded in setup would answer 409 again: exclude the other one
      { method: "POST", path: () => `/api/studies/${ids.recruiting}/exclusions`, body: () => ({ scope: "participant", participantId: ids.invitation, reason: "made by the role matrix" }), allowed: ["researcher"] },
    ],
  },
  "app/api/studies/[id]/exclusions/[xid]/route.ts": { calls: [{ method: "DELETE", path: () => `/api/studies/${ids.recruiting}/exclusions/${ids.exclusion}`, allowed: ["researcher"] }] },
  "app/api/studies/[id]/erasures/route.ts": { calls: [{ method: "POST", path: () => `/api/studies/${ids.recruiting}/erasures`, body: () => ({ code: erasable, confirm: true }), allowed: ["researcher"] }] },
  // the information page is a GET of /s/public/<token>; this POST is its "Start" form, anonymous by design (tests/e2e/lifecycle-public.spec.ts)
  "app/api/public/[token]/route.ts": { public: true, note: "a public link's Start form: the link itself is the invitation; creates one participant per browser, cap checked atomically" },
};

