import { expect, test, type Page } from "@playwright/test";
import type { Knex } from "knex";
import { createSessionStudy, fixtureDb, motionDesign } from "./fixtures/session-study";
import { demo, signInWithForm } from "./helpers";

// A researcher checks a recruiting study on a phone. A page wider than the screen makes a mobile
// browser widen its layout viewport and zoom out (CSSOM View: scrollWidth beyond clientWidth;
// the meta viewport's width=device-width), and pointer input then landed on the options above
// "Start export". The page must fit the screen's width, and a real tap (touch events, CDP
// Input.dispatchTouchEvent through Playwright) and a real mouse click on its buttons must reach them,
// also just after the page refreshed itself.

let db: Knex;
let studyId: number;
test.use({ viewport: { width: 412, height: 915 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 });
test.beforeAll(async () => {
  db = fixtureDb();
  studyId = (await createSessionStudy(db, `Results on a phone ${Date.now()}`, motionDesign, 2)).studyId;
});
test.afterAll(async () => {
  await db.destroy();
});

const overflow = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

test("a recruiting study's results and consent pages fit a phone's width; Start export takes a mouse click right after a refresh", async ({ page }) => {
  test.setTimeout(120_000);
  const owner = demo("researcher"); // the fixture's studies belong to the demo researcher
  await signInWithForm(page, owner.email, owner.password);
  await page.waitForURL(/\/studies/);
  await page.goto(`/studies/${studyId}/results`);
  await expect(page.getByTestId("progress-table")).toBeVisible({ timeout: 30_000 });
  expect(await overflow(page)).toBeLessThanOrEqual(0);
  expect(await page.evaluate(() => window.innerWidth)).toBe(412);

  // the page refreshes itself every 15 s while the study recruits: click as a refresh lands
  await page.waitForResponse((r) => r.url().includes(`/api/studies/${studyId}/results`) && r.request().method() === "GET", { timeout: 30_000 });
  const [posted] = await Promise.all([
    page.waitForResponse((r) => r.url().endsWith(`/api/studies/${studyId}/exports`) && r.request().method() === "POST"),
    page.getByRole("button", { name: "Start export" }).click({ timeout: 10_000 }),
  ]);
  expect(posted.status()).toBe(202);
  const { export: job } = (await posted.json()) as { export: { id: number } };
  const row = page.getByTestId(`export-${job.id}`);
  await expect(row.getByText("done", { exact: true })).toBeVisible({ timeout: 45_000 });
  // the list of archives (a wide table) scrolls inside its card: the page stays the screen's width
  expect(await overflow(page)).toBeLessThanOrEqual(0);
  const [download] = await Promise.all([page.waitForEvent("download"), row.getByRole("link", { name: "Download" }).tap({ timeout: 10_000 })]);
  expect(download.suggestedFilename()).toMatch(/\.zip$/);

  await page.goto(`/studies/${studyId}/consent`);
  const register = page.getByRole("link", { name: "Consent register (CSV)" });
  await expect(register).toBeVisible();
  expect(await overflow(page)).toBeLessThanOrEqual(0);
  const [csv] = await Promise.all([page.waitForEvent("download"), register.click({ timeout: 10_000 })]);
  expect(csv.suggestedFilename()).toMatch(/\.csv$/);
});
