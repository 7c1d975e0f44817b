import { expect, test } from "@playwright/test";
import type { Knex } from "knex";
import { apiAsRole } from "./helpers";
import { fixtureDb } from "./fixtures/session-study";
import { passChecks, tapUntilComplete } from "./fixtures/session-flow";
import { TOUCH_DESIGN, lifecycleStudy, signedIn } from "./fixtures/lifecycle";

// A researcher pilots a draft on a phone through the short link's QR code, then deletes the pilot:
// the pilot takes no counterbalancing place, leaves no consent record, and nothing of it remains.

let db: Knex;
test.beforeAll(() => {
  db = fixtureDb();
});
test.afterAll(async () => {
  await db.destroy();
});

test("a researcher pilots a draft on a phone-sized context and deletes the pilot", async ({ browser }) => {
  test.setTimeout(150_000);
  const api = await apiAsRole("researcher");
  const studyId = await lifecycleStudy(api, null, TOUCH_DESIGN, "draft");
  await api.dispose();

  const desk = await signedIn(await (await browser.newContext()).newPage(), "researcher");
  await desk.goto(`/studies/${studyId}`);
  await desk.getByRole("button", { name: "Pilot on a phone" }).click();
  const card = desk.getByTestId("short-link");
  await expect(card.getByRole("img", { name: /QR code for/ })).toBeVisible();
  const shortUrl = (await card.getByTestId("short-link-url").textContent())!;
  expect(shortUrl).toMatch(/\/go\/[2-9A-HJKMNP-Z]{8}$/);

  // the phone: what its camera reads from the QR code is the short address
  const phone = await (await browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true, deviceScaleFactor: 3 })).newPage();
  await phone.goto(shortUrl);
  await expect(phone).toHaveURL(/\/s\/[A-Za-z0-9_-]{22}$/);
  await expect(phone.getByTestId("pilot-banner")).toBeVisible();
  const code = (await phone.getByTestId("participant-code").first().textContent())!;
  expect(code).toMatch(/^P-/);
  await passChecks(phone, { motion: false });
  await tapUntilComplete(phone, 80);
  await expect(phone.getByTestId("completion-code")).toBeVisible({ timeout: 30_000 });
  await expect(phone.getByTestId("pilot-banner")).toBeVisible();

  const pilot = await db("participants").where({ study_id: studyId, code }).first<{ id: number; kind: string; cb_slot: number | null; status: string }>();
  expect(pilot).toMatchObject({ kind: "pilot", cb_slot: null, status: "completed" });
  expect(await db("consent_records").where({ participant_id: pilot!.id }).first()).toBeUndefined();
  expect(await db("trials").where({ participant_id: pilot!.id }).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 2 * 5 }]);

  // shown apart from real participants, and deleted from there
  await desk.goto(`/studies/${studyId}/participants`);
  await expect(desk.getByRole("table", { name: "Participants" }).getByText("No participants yet.")).toBeVisible();
  const row = desk.getByRole("table", { name: "Pilots" }).locator(`tr[data-code="${code}"]`);
  await expect(row).toContainText("complete");
  desk.once("dialog", (d) => void d.accept());
  await row.getByRole("button", { name: "Delete" }).click();
  await expect(desk.getByRole("status")).toHaveText(`${code} is deleted.`, { timeout: 20_000 });
  await expect(desk.getByRole("table", { name: "Pilots" }).getByText("No pilots yet.")).toBeVisible({ timeout: 20_000 });
  for (const table of ["trials", "sequence_streams", "calibrations", "questionnaire_answers", "consent_records"]) {
    expect(await db(table).where({ participant_id: pilot!.id }).count<{ n: number }[]>({ n: "*" }), table).toEqual([{ n: 0 }]);
  }
  expect(await db("participants").where({ id: pilot!.id }).first()).toBeUndefined();
});
