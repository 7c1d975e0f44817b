import { expect, test } from "@playwright/test";
import { apiAsRole, linkInMail, mailTo, signInWithForm } from "./helpers";
import { FOUR_GAINS, lifecycleStudy, signedIn } from "./fixtures/lifecycle";

// Invitations as a lab sends them: the e-mail carries the invitation text the reviewer approved
// (a later edit waits for its own review), the team re-sends, reminds and revokes; a revoked link
// says so at once on the participant's phone; the owner alone sees which address got which code.

const EDITOR = "priya@harbourview-lab.example"; // a demo researcher, added to this study as editor

test("invitations are sent with the approved text, re-sent, reminded and revoked; the owner alone sees addresses", async ({ browser }) => {
  test.setTimeout(150_000);
  const [ownerApi, reviewerApi] = [await apiAsRole("researcher"), await apiAsRole("reviewer")];
  const studyId = await lifecycleStudy(ownerApi, null, FOUR_GAINS, "draft");
  const approvedText = `Dear colleague, we would like you to aim at targets with your own phone (${Date.now()}).`;
  const waitingText = "This newer wording waits for the reviewer and must not reach anyone yet.";
  expect((await ownerApi.put(`/api/studies/${studyId}/invitation-text`, { data: { text: approvedText } })).status()).toBe(200);
  expect((await ownerApi.post(`/api/studies/${studyId}/team`, { data: { email: EDITOR, role: "editor" } })).status()).toBe(200);
  expect((await ownerApi.post(`/api/studies/${studyId}/submit`)).status()).toBeLessThan(300);
  expect((await reviewerApi.post(`/api/review/${studyId}/decision`, { data: { decision: "approve", comment: "" } })).status()).toBeLessThan(300);
  expect((await ownerApi.post(`/api/studies/${studyId}/recruitment`, { data: { action: "open" } })).status()).toBeLessThan(300);
  // after approval a new wording is an amendment: saved as a draft version, not used until approved
  expect((await ownerApi.put(`/api/studies/${studyId}/invitation-text`, { data: { text: waitingText } })).status()).toBe(200);

  const owner = await signedIn(await (await browser.newContext()).newPage(), "researcher");
  await owner.goto(`/studies/${studyId}/recruitment`);
  const stamp = Date.now();
  const [kept, revoked] = ["kept", "revoked"].map((w) => `${w}.${stamp}@mailbox.example`) as [string, string];
  await owner.getByLabel("Addresses (one per line)").fill(`${kept}\n${revoked}`);
  await owner.getByRole("button", { name: "Send invitations" }).click();
  await expect(owner.getByRole("status")).toContainText("Sent 2 invitation(s)");
  for (const a of [kept, revoked]) {
    const [m] = await mailTo(a);
    expect(m?.text).toContain(approvedText);
    expect(m?.text).not.toContain(waitingText);
  }
  const firstLink = await linkInMail(kept, /^Invitation to take part/);

  // re-send and remind: the same link again, then a reminder
  const invitations = owner.getByRole("table", { name: "Invitations" });
  await expect(invitations.getByRole("columnheader", { name: "Address" })).toBeVisible();
  const keptRow = invitations.getByRole("row").filter({ hasText: kept });
  const keptCode = (await keptRow.getByRole("cell").first().textContent())!;
  await keptRow.getByRole("button", { name: "Re-send" }).click();
  await expect(owner.getByRole("status").filter({ hasText: `The invitation to ${keptCode} was sent again.` })).toBeVisible({ timeout: 20_000 });
  await expect.poll(async () => (await mailTo(kept)).length, { timeout: 15_000 }).toBe(2);
  expect((await mailTo(kept))[1]!.text).toContain(firstLink);
  await expect(keptRow.getByRole("cell").nth(5)).toContainText("2, last ");
  await keptRow.getByRole("button", { name: "Remind" }).click();
  await expect(owner.getByRole("status").filter({ hasText: `A reminder went to ${keptCode}.` })).toBeVisible({ timeout: 20_000 });
  await expect.poll(async () => (await mailTo(kept)).at(-1)?.subject ?? "", { timeout: 15_000 }).toMatch(/^Reminder: Invitation to take part/);

  // revoke: the link stops working, and the participant's phone says so on the first screen
  const revokedLink = await linkInMail(revoked, /^Invitation to take part/);
  const revokedRow = invitations.getByRole("row").filter({ hasText: revoked });
  const revokedCode = (await revokedRow.getByRole("cell").first().textContent())!;
  owner.once("dialog", (d) => void d.accept());
  await revokedRow.getByRole("button", { name: "Revoke" }).click();
  await expect(owner.getByRole("status").filter({ hasText: `${revokedCode} is revoked.` })).toBeVisible({ timeout: 20_000 });
  await expect(revokedRow.getByRole("cell").nth(3)).toHaveText("revoked");
  const phone = await (await browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true })).newPage();
  await phone.goto(revokedLink);
  await expect(phone.getByTestId("invitation-revoked")).toContainText("withdrawn by the research team");
  await expect(phone.getByRole("button", { name: "Continue" })).toHaveCount(0);
  await phone.goto(firstLink);
  await expect(phone.getByRole("button", { name: "Continue" })).toBeVisible();
  await owner.goto(`/studies/${studyId}/participants`);
  await expect(owner.getByRole("table", { name: "Participants" }).locator(`tr[data-code="${revokedCode}"] td[data-col="status"]`)).toHaveText("revoked");

  // the editor manages invitations by code, without the addresses
  const editor = await (await browser.newContext()).newPage();
  await signInWithForm(editor, EDITOR, "demo-research-priya");
  await editor.waitForURL(/\/studies/);
  await editor.goto(`/studies/${studyId}/recruitment`);
  const editorView = editor.getByRole("table", { name: "Invitations" });
  await expect(editorView.getByRole("row").filter({ hasText: keptCode })).toBeVisible();
  await expect(editorView.getByRole("columnheader", { name: "Address" })).toHaveCount(0);
  await expect(editor.locator("body")).not.toContainText(kept);
  await expect(editorView.getByRole("row").filter({ hasText: keptCode }).getByRole("button", { name: "Remind" })).toBeVisible();
  for (const c of [ownerApi, reviewerApi]) await c.dispose();
});
