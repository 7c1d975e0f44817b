import type { Clients, Entry } from "./types";

let demoStudyId = 0;

/** Finds the ids this area's calls need (runs once, signed in as every role). */
export async function setup(clients: Clients): Promise<void> {
  const res = await clients.get("researcher")!.get("/api/studies");
  const body = (await res.json()) as { studies?: { id: number; myRole?: string | null }[] } | { id: number }[];
  const list = Array.isArray(body) ? body : body.studies ?? [];
  demoStudyId = list[0]?.id ?? 1;
}

const SESSION_SPEC = "tests/e2e/session-access.spec.ts";
const token = (file: string): [string, Entry] => [file, { token: true, checkedIn: SESSION_SPEC }];

export const ENTRIES: Record<string, Entry> = {
  ...Object.fromEntries([
    "app/api/session/[token]/route.ts",
    "app/api/session/[token]/consent/route.ts",
    "app/api/session/[token]/device/route.ts",
    "app/api/session/[token]/calibration/route.ts",
    "app/api/session/[token]/progress/route.ts",
    "app/api/session/[token]/questionnaire/route.ts",
    "app/api/session/[token]/withdraw/route.ts",
    "app/api/session/[token]/sequences/route.ts",
    "app/api/session/[token]/complete/route.ts",
    "app/api/session/[token]/start/route.ts",
  ].map(token)),
  "app/api/studies/[id]/monitor/route.ts": {
    calls: [{ method: "GET", path: () => `/api/studies/${demoStudyId}/monitor`, allowed: ["researcher"] }],
  },
};
