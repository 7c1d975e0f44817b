import { expect, test } from "@playwright/test";
import { apiAsRole, baseURL } from "./helpers";
import { FOUR_GAINS, lifecycleStudy, links, participant, signedIn } from "./fixtures/lifecycle";

// Counterbalancing with replacement: four participants start; one is refused at the device check
// (in the browser: this desktop has no motion sensors), one withdraws; the next two fill the rows
// the drop-outs left, so the four who complete fill the Williams square's four rows once each.

test("four start, one is refused at the device check, one withdraws, and the next two fill their rows", async ({ page }) => {
  test.setTimeout(150_000);
  const [researcherApi, reviewerApi] = [await apiAsRole("researcher"), await apiAsRole("reviewer")];
  const screened = `${baseURL}/api/health?screened=1`;
  const studyId = await lifecycleStudy(researcherApi, reviewerApi, FOUR_GAINS, "recruiting", { returnUrlScreened: screened });
  const [a, b, c, d, e, f] = await links(researcherApi, studyId, 6);

  // a: a desktop browser without motion sensors is refused, and offered the way back
  await page.goto(`/s/${a!.token}`);
  await page.getByRole("button", { name: "Continue" }).click();
  for (const box of await page.getByRole("checkbox").all()) await box.check();
  await page.getByRole("button", { name: "I agree and take part" }).click();
  await page.getByRole("button", { name: "Check my device" }).click();
  await expect(page.getByText(/This study needs a device with motion sensors/)).toBeVisible({ timeout: 15_000 });
  await expect(page.getByTestId("screened-return")).toHaveAttribute("href", screened);

  // b, c, d start their tasks through their own session API (as the runner does)
  const [pb, pc, pd, pe, pf] = await Promise.all([b, c, d, e, f].map((x) => participant(x!.token)));
  for (const p of [pb!, pc!, pd!]) {
    expect(await p.consent()).toBe(201);
    expect((await p.device("ok")).status()).toBe(200);
    expect((await p.start()).status()).toBe(200);
  }
  expect((await pc!.post("withdraw", {})).status()).toBe(200);
  for (const p of [pe!, pf!]) {
    expect(await p.consent()).toBe(201);
    await p.device("ok");
    await p.start();
  }
  for (const p of [pb!, pd!, pe!, pf!]) await p.finish();

  // the design page: every row filled once, nothing in progress, nothing free
  await signedIn(page, "researcher");
  await page.goto(`/studies/${studyId}/design`);
  const balance = page.getByTestId("place-balance");
  await expect(balance.locator("tbody tr")).toHaveCount(4);
  for (let row = 0; row < 4; row++) {
    const tr = balance.locator(`tr[data-row="${row}"]`);
    await expect(tr.locator('[data-col="filled"]')).toHaveText("1");
    await expect(tr.locator('[data-col="in-progress"]')).toHaveText("0");
    await expect(tr.locator('[data-col="free"]')).toHaveText("0");
  }
  // the live monitor: stage and device verdict, the refused participant not counted as in progress, each code a link to their page
  await page.goto(`/studies/${studyId}/monitor`);
  await expect(page.getByTestId("monitor-counts")).toContainText("0 in progress, 1 refused at the device check, 6 started in total.");
  const refusedRow = page.getByRole("table", { name: "Live sessions" }).getByRole("row").filter({ hasText: a!.code });
  await expect(refusedRow.getByRole("cell").nth(2)).toHaveText("device check");
  await expect(refusedRow.getByRole("cell").nth(3)).toHaveText("refused");
  await refusedRow.getByRole("link", { name: a!.code }).click();
  await expect(page.getByRole("heading", { name: `Participant ${a!.code}` })).toBeVisible();

  // the completed orders, as the participants page's rows show them: 1, 2, 3, 4 once each
  await page.goto(`/studies/${studyId}/participants`);
  const table = page.getByRole("table", { name: "Participants" });
  const rows = await Promise.all([b, d, e, f].map(async (x) => (await table.locator(`tr[data-code="${x!.code}"] td[data-col="row"]`).textContent())!));
  expect(rows.sort()).toEqual(["1", "2", "3", "4"]);
  await expect(table.locator(`tr[data-code="${c!.code}"]`)).toContainText("released: withdrew");
  await expect(table.locator(`tr[data-code="${a!.code}"]`)).toContainText("refused");
  for (const p of [pb, pc, pd, pe, pf]) await p!.dispose();
  for (const x of [researcherApi, reviewerApi]) await x.dispose();
});
