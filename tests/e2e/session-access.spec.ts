import { randomBytes } from "node:crypto";
import { expect, request, test, type APIRequestContext } from "@playwright/test";
import type { Knex } from "knex";
import { planSession, type SessionState } from "../../lib/runner";
import { batchFor as batchForDesign } from "./fixtures/session-batch";
import { studyDesignSchema } from "../../lib/study/design";
import { apiAsRole, baseURL } from "./helpers";
import { createSessionStudy, fixtureDb, motionDesign, type SessionFixture } from "./fixtures/session-study";

// The token routes of the role matrix (tests/e2e/matrix/participant.ts): a link token reaches
// only its own session; an unknown token is 404; staff cookies do not stand in for a token;
// uploads are idempotent; malformed or implausible uploads are refused with 422; a withdrawn
// participant's later uploads are refused (410) and, by the study's rule, earlier data is erased.

let db: Knex;
let fx: SessionFixture;
let anon: APIRequestContext;
const design = studyDesignSchema.parse(motionDesign);

test.beforeAll(async () => {
  db = fixtureDb();
  fx = await createSessionStudy(db, `Session access ${Date.now()}`, motionDesign, 2);
  anon = await request.newContext({ baseURL });
});
test.afterAll(async () => {
  await anon.dispose();
  await db.destroy();
});

async function consent(token: string): Promise<SessionState> {
  const state = (await (await anon.get(`/api/session/${token}`)).json()) as SessionState;
  const res = await anon.post(`/api/session/${token}/consent`, { data: { consentVersionId: state.consent!.versionId, versionHash: state.consent!.hash, agreed: ["s1", "s2", "s3"], typedName: "Sam Example", screenShortSidePx: 800 } });
  expect(res.status(), await res.text()).toBe(201);
  // the order comes with a counterbalancing place when the first task sequence starts, not at consent
  expect(((await (await anon.get(`/api/session/${token}`)).json()) as SessionState).order).toBeNull();
  const start = await anon.post(`/api/session/${token}/start`, { data: {} });
  expect(start.status(), await start.text()).toBe(200);
  return (await (await anon.get(`/api/session/${token}`)).json()) as SessionState;
}

test("a token reaches only its own session; unknown tokens are 404; staff cookies are no substitute", async () => {
  const [a, b] = fx.participants;
  const stateA = (await (await anon.get(`/api/session/${a!.token}`)).json()) as SessionState;
  expect(stateA.participantId).toBe(a!.id);
  expect(JSON.stringify(stateA)).not.toContain(b!.code);
  expect(JSON.stringify(stateA)).not.toContain(a!.completionCode); // not before completion
  for (const bad of [randomBytes(16).toString("base64url"), "x", "%2e%2e"]) {
    expect((await anon.get(`/api/session/${bad}`)).status()).toBe(404);
    expect((await anon.post(`/api/session/${bad}/withdraw`, { data: {} })).status()).toBe(404);
    expect((await anon.post(`/api/session/${bad}/start`, { data: {} })).status()).toBe(404);
  }
  expect((await anon.get(`/s/${randomBytes(16).toString("base64url")}`)).status()).toBe(404);
  for (const role of ["admin", "researcher", "reviewer"] as const) {
    const staff = await apiAsRole(role);
    const unknown = randomBytes(16).toString("base64url");
    expect((await staff.get(`/api/session/${unknown}`)).status(), role).toBe(404);
    expect((await staff.post(`/api/session/${unknown}/sequences`, { data: {} })).status(), role).toBe(404);
    expect((await staff.get("/api/session/")).status(), role).toBe(404);
    await staff.dispose();
  }
});

test("uploads: idempotent by key, 422 for malformed or implausible batches, 410 after withdrawal with erasure", async () => {
  const [a, b] = fx.participants;
  const stateA = await consent(a!.token);
  const stateB = await consent(b!.token);
  expect(stateA.order).not.toBeNull();
  const planA = planSession(design, stateA.order!, stateA.planSeed!);
  const batchFor = (id: number, s: Parameters<typeof batchForDesign>[2]) => batchForDesign(design, id, s);
  const first = batchFor(a!.id, planA[0]!);

  const put = (token: string, data: unknown) => anon.post(`/api/session/${token}/sequences`, { data });
  const created = await put(a!.token, first);
  expect(created.status(), await created.text()).toBe(201);
  const again = await put(a!.token, first);
  expect(again.status()).toBe(200);
  expect(await again.json()).toEqual({ duplicate: true, movements: 0 });
  expect(await db("trials").where({ participant_id: a!.id }).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: design.task.targetsPerRing }]);

  // A's batch sent with B's token: not B's key → refused, and B holds nothing of A's
  expect((await put(b!.token, first)).status()).toBe(422);
  const afterB = (await (await anon.get(`/api/session/${b!.token}`)).json()) as SessionState;
  expect(afterB.uploaded).toEqual([]);
  expect(stateB.participantId).toBe(b!.id);

  // malformed: wrong types, missing stream, not gzip; implausible: a time of 0, a wrong width, too few movements
  const second = batchFor(a!.id, planA[1]!);
  expect((await put(a!.token, { ...second, movements: "none" })).status()).toBe(422);
  expect((await put(a!.token, { ...second, stream: { gzipBase64: Buffer.from("plain text, not gzip").toString("base64"), sampleCount: 1 } })).status()).toBe(422);
  expect((await put(a!.token, { ...second, movements: second.movements.map((m, i) => (i === 3 ? { ...m, time_ms: 0 } : m)) })).status()).toBe(422);
  expect((await put(a!.token, { ...second, width: second.width + 1 })).status()).toBe(422);
  expect((await put(a!.token, { ...second, movements: second.movements.slice(1) })).status()).toBe(422);
  expect((await put(a!.token, { ...second, movements: [{ ...second.movements[0]!, end_x: Number.NaN }] })).status()).toBe(422);
  const raw = await anon.fetch(`/api/session/${a!.token}/sequences`, { method: "POST", headers: { "content-type": "application/json" }, data: Buffer.from("{not json") });
  expect(raw.status()).toBe(400);

  // withdrawal: recorded, audit-logged, data erased (the study's rule), later uploads refused
  const w = await anon.post(`/api/session/${a!.token}/withdraw`, { data: { reason: "changed my mind" } });
  expect(w.status()).toBe(200);
  expect(await w.json()).toEqual({ erased: true });
  const refused = await put(a!.token, second);
  expect(refused.status()).toBe(410);
  expect(((await refused.json()) as { error: { code: string } }).error.code).toBe("withdrawn");
  expect(await db("trials").where({ participant_id: a!.id }).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 0 }]);
  expect(await db("sequence_streams").where({ participant_id: a!.id }).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 0 }]);
  const record = await db("consent_records").where({ participant_id: a!.id }).first<{ withdrawn_at: Date | null }>();
  expect(record?.withdrawn_at).not.toBeNull();
  const audit = await db("audit_log").where({ action: "participant.withdrawn", study_id: fx.studyId }).select("details");
  expect(audit).toHaveLength(1);
  expect((await anon.post(`/api/session/${a!.token}/progress`, { data: { stage: "task", done: 1, answered: [], breaks: [] } })).status()).toBe(410);
});
