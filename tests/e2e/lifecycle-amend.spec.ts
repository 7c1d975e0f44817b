import { expect, test } from "@playwright/test";
import { apiAsRole } from "./helpers";
import { FOUR_GAINS, LIFECYCLE_CONSENT, lifecycleStudy, links, participant, signedIn } from "./fixtures/lifecycle";

// An approved, recruiting study is amended (a new consent text) and re-approved while one
// participant, who consented before, keeps the version they consented to.

test("an approved study is amended and re-approved while one participant keeps the old version", async ({ browser }) => {
  test.setTimeout(120_000);
  const [researcherApi, reviewerApi] = [await apiAsRole("researcher"), await apiAsRole("reviewer")];
  const studyId = await lifecycleStudy(researcherApi, reviewerApi, FOUR_GAINS, "recruiting");
  const [early, late] = await links(researcherApi, studyId, 2);
  const p1 = await participant(early!.token);
  expect(await p1.consent()).toBe(201);
  expect((await p1.start()).status()).toBe(200);
  expect((await p1.state()).consent!.version).toBe(1);

  const added = "We now also ask how tired your wrist felt after each condition.";
  const researcher = await signedIn(await (await browser.newContext()).newPage(), "researcher");
  await researcher.goto(`/studies/${studyId}/consent`);
  await expect(researcher.getByText(/Version 1 is approved\. A new version is part of an amendment/)).toBeVisible();
  await researcher.getByLabel("Consent text (Markdown)").fill(`${LIFECYCLE_CONSENT}\n${added}\n`);
  await researcher.getByRole("button", { name: "Save consent text" }).click();
  await expect(researcher.getByRole("status")).toHaveText("Saved as version 2 (draft).");
  await researcher.getByRole("link", { name: "Review" }).click();
  await expect(researcher.getByRole("heading", { name: "Pending amendment" })).toBeVisible();
  await expect(researcher.getByLabel("Consent text: diff to the approved version 1")).toContainText(`+ ${added}`);
  await researcher.getByRole("button", { name: "Submit the amendment for review" }).click();
  await expect(researcher.getByRole("heading", { name: "Amendment in review (version 2)" })).toBeVisible();
  await expect(researcher.getByRole("table", { name: "Protocol versions" })).toContainText("waiting");

  // still recruiting under version 1 while the reviewer decides
  const p2 = await participant(late!.token);
  expect((await p2.state()).consent!.version).toBe(1);

  const reviewer = await signedIn(await (await browser.newContext()).newPage(), "reviewer");
  const queued = reviewer.getByRole("table", { name: "Review queue" }).getByRole("row").filter({ has: reviewer.locator(`a[href="/review/studies/${studyId}"]`) });
  await expect(queued).toContainText("amendment (version 2)");
  await queued.getByRole("link").click();
  await expect(reviewer.getByRole("heading", { name: "Amendment: changes since the approved version 1" })).toBeVisible();
  await expect(reviewer.getByLabel("Consent text: diff to the approved version 1")).toContainText(`+ ${added}`);
  await reviewer.getByRole("button", { name: "Approve" }).click();
  await expect(reviewer.getByText("No submission is waiting for a decision.")).toBeVisible();

  // the participant who consented keeps version 1; the next one consents to version 2
  const kept = await p1.state();
  expect(kept.consent!.version).toBe(1);
  expect(kept.consent!.body).not.toContain(added);
  const now = await p2.state();
  expect(now.consent!.version).toBe(2);
  expect(now.consent!.body).toContain(added);
  expect(await p2.consent()).toBe(201);

  await researcher.goto(`/studies/${studyId}`);
  await expect(researcher.getByTestId("protocol-status")).toContainText("version 2 in force");
  await researcher.goto(`/studies/${studyId}/participants`);
  const table = researcher.getByRole("table", { name: "Participants" });
  await expect(table.locator(`tr[data-code="${late!.code}"] td[data-col="version"]`)).toHaveText("2");
  await expect(table.locator(`tr[data-code="${early!.code}"] td[data-col="version"]`)).toHaveText("1");

  // the reviewer's list of the studies they approved, and the audit trail's details of the approval
  await reviewer.goto("/review");
  const mine = reviewer.getByRole("table", { name: "Studies you approved" }).getByRole("row").filter({ has: reviewer.locator(`a[href="/review/studies/${studyId}"]`) });
  await expect(mine.getByRole("cell").nth(3)).toHaveText("recruiting");
  await expect(mine.getByRole("cell").nth(4)).toContainText("1, 2 (last ");
  await expect(mine.getByRole("cell").nth(5)).toHaveText("2");
  await mine.getByRole("link", { name: "trail" }).click();
  await expect(reviewer).toHaveURL(new RegExp(`/review/audit\\?study=${studyId}$`));
  const approvals = reviewer.getByRole("table", { name: "Audit trail" }).getByRole("row").filter({ has: reviewer.getByRole("cell", { name: "review.approve", exact: true }) });
  await expect(approvals).toHaveCount(2);
  await expect(approvals.first().locator('dt:text-is("protocolVersion") + dd')).toHaveText("2"); // newest first
  await expect(approvals.last().locator('dt:text-is("protocolVersion") + dd')).toHaveText("1");
  for (const c of [p1, p2]) await c.dispose();
  for (const c of [researcherApi, reviewerApi]) await c.dispose();
});
