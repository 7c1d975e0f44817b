import { expect, test } from "@playwright/test";
import type { Knex } from "knex";
import { apiAsRole, mailTo } from "./helpers";
import { fixtureDb } from "./fixtures/session-study";
import { FOUR_GAINS, lifecycleStudy, links, participant, signedIn } from "./fixtures/lifecycle";

// Erasure on request, after completion: the owner erases by the code the participant quotes; every
// table is queried for the participant's id; the archive that held them is superseded.

let db: Knex;
test.beforeAll(() => {
  db = fixtureDb();
});
test.afterAll(async () => {
  await db.destroy();
});

test("an erasure by code after completion removes every row and supersedes an archive", async ({ page }) => {
  test.setTimeout(150_000);
  const [researcher, reviewer] = [await apiAsRole("researcher"), await apiAsRole("reviewer")];
  const studyId = await lifecycleStudy(researcher, reviewer, FOUR_GAINS, "recruiting");
  const [who, other] = await links(researcher, studyId, 2);
  const email = `erase.me.${Date.now()}@mailbox.example`;
  for (const [x, extra] of [[who!, { email }], [other!, {}]] as const) {
    const p = await participant(x.token);
    expect(await p.consent(extra)).toBe(201);
    await p.device("ok");
    await p.start();
    await p.finish();
    await p.dispose();
  }
  // the consent copy tells the participant their code
  await expect.poll(async () => (await mailTo(email)).at(-1)?.text ?? "", { timeout: 15_000 }).toContain(`Your participant code: ${who!.code}`);
  const pid = (await db("participants").where({ study_id: studyId, code: who!.code }).first<{ id: number }>("id"))!.id;

  // an archive that holds them
  const started = await researcher.post(`/api/studies/${studyId}/exports`, { data: {} });
  expect(started.status(), await started.text()).toBe(202);
  const exportId = ((await started.json()) as { export: { id: number } }).export.id;
  await expect.poll(async () => ((await (await researcher.get(`/api/exports/${exportId}`)).json()) as { export: { status: string } }).export.status, { timeout: 60_000 }).toBe("done");
  expect((await researcher.get(`/api/exports/${exportId}/download`)).status()).toBe(200);

  await signedIn(page, "researcher");
  await page.goto(`/studies/${studyId}/participants`);
  await page.getByLabel("Participant code").fill(who!.code.toLowerCase());
  await page.getByLabel("I understand this cannot be undone").check();
  await page.getByRole("button", { name: "Erase" }).click();
  await expect(page.getByTestId("erasure-report")).toContainText(`Superseded archive(s): #${exportId}.`, { timeout: 20_000 });
  await expect(page.getByTestId("erasure-report")).toContainText("trials");

  // every table with a participant_id column, found in the database's own catalogue
  const [cols] = (await db.raw("SELECT table_name AS t FROM information_schema.columns WHERE table_schema = DATABASE() AND column_name = 'participant_id'")) as [{ t: string }[]];
  const tables = [...new Set(cols.map((c) => c.t))].sort();
  expect(tables).toEqual(expect.arrayContaining(["calibrations", "consent_records", "exclusions", "questionnaire_answers", "sequence_streams", "trials"]));
  for (const t of tables) {
    const n = Number(((await db(t).where({ participant_id: pid }).count({ n: "*" })) as { n: number }[])[0]!.n);
    // the consent record stays, stripped, so the ethics board's register shows consent was given and later erased
    expect(n, t).toBe(t === "consent_records" ? 1 : 0);
  }
  const record = await db("consent_records").where({ participant_id: pid }).first<{ typed_name_encrypted: string | null; device_summary: unknown; erased_at: Date | null }>();
  expect(record).toMatchObject({ typed_name_encrypted: null, device_summary: null });
  expect(record!.erased_at).not.toBeNull();
  const tomb = await db("participants").where({ id: pid }).first<Record<string, unknown>>();
  expect(tomb).toMatchObject({ status: "withdrawn", completion_code: null, condition_order: null, progress: null, device: null, panel_id_encrypted: null });
  // the other participant keeps everything
  const otherId = (await db("participants").where({ study_id: studyId, code: other!.code }).first<{ id: number }>("id"))!.id;
  expect(Number(((await db("trials").where({ participant_id: otherId }).count({ n: "*" })) as { n: number }[])[0]!.n)).toBe(4 * 5);

  // the archive is superseded: listed so, and its download refused
  const refused = await researcher.get(`/api/exports/${exportId}/download`);
  expect(refused.status()).toBe(410);
  await page.goto(`/studies/${studyId}/results`);
  await expect(page.getByTestId(`export-${exportId}`)).toContainText("superseded", { timeout: 30_000 });
  // the audit log says what was erased, never why
  const audit = await db("audit_log").where({ study_id: studyId, action: "participant.erased" }).first<{ details: unknown }>("details");
  const details = JSON.stringify(audit!.details);
  expect(details).toContain(who!.code);
  expect(details).not.toMatch(/reason/i);
  for (const c of [researcher, reviewer]) await c.dispose();
});
