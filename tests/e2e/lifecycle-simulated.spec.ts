import { expect, test } from "@playwright/test";
import { apiAsRole } from "./helpers";
import { TWO_GAINS, lifecycleStudy, signedIn } from "./fixtures/lifecycle";

// A simulated pilot of 6 before anyone real takes part: the time per session, then the results page.


test("a researcher runs a simulated pilot of 6 and sees the results", async ({ page }) => {
  test.setTimeout(120_000);
  const api = await apiAsRole("researcher");
  const studyId = await lifecycleStudy(api, null, TWO_GAINS, "draft");
  await api.dispose();

  await signedIn(page, "researcher");
  await page.goto(`/studies/${studyId}`);
  await expect(page.getByLabel("Simulated participants")).toHaveValue("6");
  await page.getByRole("button", { name: "Run the simulated pilot" }).click();
  const summary = page.getByTestId("simulated-summary");
  // 6 people × 2 conditions × 2 A×W pairs × 9 movements (a ring of 9 targets: 9 selections after the first, ISO 9241-411)
  await expect(summary).toContainText("6 simulated participants ran 216 measured movements", { timeout: 60_000 });
  await expect(summary).toContainText(/Time per session: median \d+(\.\d)? min/);
  await summary.getByRole("link", { name: "See the results" }).click();
  const tp = page.getByTestId("figure-tp");
  await expect(tp).toBeVisible({ timeout: 30_000 });
  for (const c of ["gain 2", "gain 5"]) await expect(tp.locator("svg")).toContainText(c);
  await expect(page.getByTestId("pilots-included")).toContainText("6 pilot or simulated participant(s) included");

  await page.goto(`/studies/${studyId}/participants`);
  await expect(page.getByRole("table", { name: "Pilots" }).locator("tbody tr")).toHaveCount(6);
  await expect(page.getByRole("table", { name: "Pilots" })).toContainText("simulated");
});
