import { expect, test, type Page } from "@playwright/test";
import { apiAsRole, demo, mailTo, signInWithForm } from "./helpers";
import { MATRIX_CONSENT, TINY_PDF } from "./matrix/studies";

const title = `Tablet view aiming ${Date.now()}`;

async function signIn(page: Page, role: "researcher" | "reviewer") {
  await signInWithForm(page, demo(role).email, demo(role).password);
  await expect(page).toHaveURL(role === "researcher" ? /\/studies/ : /\/review/, { timeout: 20_000 }); // sign-in hashes a password: slow on a loaded machine
}

test.describe.configure({ mode: "serial" });

test("a 2 × 2 study from design to invitations, with review and a verified audit chain", async ({ browser }) => {
  test.setTimeout(150_000); // one long path through four pages and two people
  const researcher = await (await browser.newContext()).newPage();
  await signIn(researcher, "researcher");

  // Create the study.
  await researcher.getByLabel("Title", { exact: true }).fill(title);
  await researcher.getByLabel("Summary").fill("Two techniques at two gains on a tablet (test scenario).");
  await researcher.getByRole("button", { name: "Create study" }).click();
  await expect(researcher).toHaveURL(/\/studies\/\d+\/design$/);
  const studyId = Number(researcher.url().match(/studies\/(\d+)/)![1]);

  // Design: technique (motion, stick) × gain (3, 6).
  await researcher.getByRole("button", { name: "Add level to factor 1" }).click();
  await researcher.getByLabel("Factor 1 level 2 label").fill("stick");
  await researcher.getByLabel("Factor 1 level 2 Input technique", { exact: true }).selectOption("stick");
  await researcher.getByRole("button", { name: "Add factor" }).click();
  await researcher.getByLabel("Factor 2 name").fill("gain");
  await researcher.getByLabel("Factor 2 level 1 label").fill("gain 3");
  await researcher.getByLabel("Factor 2 level 1 CD gain", { exact: true }).fill("3");
  await researcher.getByRole("button", { name: "Add level to factor 2" }).click();
  await researcher.getByLabel("Factor 2 level 2 label").fill("gain 6");
  await researcher.getByLabel("Factor 2 level 2 CD gain", { exact: true }).fill("6");
  await researcher.getByLabel("Planned participants (N)").fill("10");

  // Bad input is refused at the field: an even ring and W ≥ A.
  await researcher.getByLabel("Targets per ring (odd)").fill("12");
  await researcher.getByLabel("Widths (W)").fill("2, 50");
  await researcher.getByRole("button", { name: "Save design" }).click();
  await expect(researcher.locator('[id="err-task.targetsPerRing"]')).toHaveText("must be odd, so every hop crosses the ring");
  await expect(researcher.locator('[id="err-task.widths.1"]')).toHaveText("every width must be smaller than every amplitude (W < A)");
  await researcher.getByLabel("Targets per ring (odd)").fill("13");
  await researcher.getByLabel("Widths (W)").fill("2, 4");

  // Williams (1949): 4 conditions → 4 rows; N = 10 is not a multiple → warning.
  const preview = researcher.getByRole("table", { name: "Order preview" });
  await expect(preview.locator("tbody tr")).toHaveCount(10);
  await expect(researcher.getByText(/10 participants is not a multiple of the 4 orders/)).toBeVisible();
  await researcher.getByLabel("Planned participants (N)").fill("8");
  await expect(researcher.getByText(/is not a multiple/)).toHaveCount(0);
  // 4 conditions × (2 A × 2 W) × 1 sequence × 1 block × 13 movements = 208 (ISO ring: n movements per sequence).
  await expect(researcher.getByRole("region", { name: "Design summary" })).toContainText("4 conditions · 208 trials per participant (+52 practice)");
  await researcher.getByRole("button", { name: "Save design" }).click();
  await expect(researcher.getByRole("status")).toHaveText("Design saved.");

  // Consent version 1.
  await researcher.getByRole("link", { name: "Consent" }).click();
  await researcher.getByLabel("Consent text (Markdown)").fill(MATRIX_CONSENT);
  await expect(researcher.getByRole("list", { name: "Consent checklist" })).not.toContainText("missing");
  await researcher.getByRole("button", { name: "Save consent text" }).click();
  await expect(researcher.getByRole("status")).toContainText("Saved as version 1");

  // Documents: a PDF is stored; a text file calling itself PNG is refused (415).
  await researcher.getByRole("link", { name: "Documents" }).click();
  await researcher.getByLabel(/^File/).setInputFiles({ name: "not-an-image.png", mimeType: "image/png", buffer: Buffer.from("just text") });
  await researcher.getByRole("button", { name: "Upload" }).click();
  await expect(researcher.locator("p.field-error")).toContainText("Only PDF, PNG and JPEG");
  await researcher.getByLabel(/^File/).setInputFiles({ name: "approval-letter.pdf", mimeType: "application/pdf", buffer: TINY_PDF });
  await researcher.getByRole("button", { name: "Upload" }).click();
  await expect(researcher.getByRole("status")).toContainText("Uploaded approval-letter.pdf");
  await expect(researcher.getByRole("link", { name: "approval-letter.pdf" })).toBeVisible();

  // Submit.
  await researcher.getByRole("link", { name: "Review", exact: true }).click();
  await researcher.getByRole("button", { name: "Submit for review" }).click();
  // The button goes once the page refreshes, so check the outcome rather than its message.
  await expect(researcher.getByRole("cell", { name: "waiting", exact: true })).toBeVisible();
  await expect(researcher.getByText("In review", { exact: true })).toBeVisible();

  // The reviewer approves from the queue.
  const reviewer = await (await browser.newContext()).newPage();
  await signIn(reviewer, "reviewer");
  await reviewer.getByRole("link", { name: title }).click();
  await expect(reviewer.getByRole("heading", { name: /Consent version 1/ })).toBeVisible();
  await expect(reviewer.getByRole("link", { name: "approval-letter.pdf" })).toBeVisible();
  await expect(reviewer.getByRole("link", { name: "Consent register (CSV)" })).toHaveAttribute("href", `/api/studies/${studyId}/consent-register`);
  await reviewer.getByRole("button", { name: "Approve" }).click();
  await expect(reviewer.getByText("No submission is waiting for a decision.")).toBeVisible();
  await expect(reviewer.getByRole("cell", { name: "approved", exact: true })).toBeVisible();

  // The researcher opens recruitment and sends three invitations.
  await researcher.getByRole("link", { name: "Recruitment" }).click();
  await researcher.getByRole("button", { name: "Open recruitment" }).click();
  await expect(researcher.getByRole("status")).toHaveText("Recruitment is open.");
  const stamp = Date.now();
  const addresses = [1, 2, 3].map((i) => `volunteer${i}.${stamp}@mailbox.example`);
  await researcher.getByLabel("Addresses (one per line)").fill(addresses.join("\n"));
  await researcher.getByRole("button", { name: "Send invitations" }).click();
  await expect(researcher.getByRole("status")).toContainText("Sent 3 invitation(s)");
  await expect(researcher.getByRole("table", { name: "Invitations" }).locator("tbody tr")).toHaveCount(3);
  await expect(researcher.getByTestId("participant-counts")).toContainText("3 participant(s): 3 not started.");
  for (const a of addresses) {
    const [m] = await mailTo(a);
    expect(m?.subject).toBe(`Invitation to take part: ${title}`);
    expect(m?.text).toMatch(/\/s\/[A-Za-z0-9_-]{22}\s/); // 128-bit token, base64url (22 characters)
    expect(m?.text).toMatch(/about \d+ minutes/);
  }

  // The reviewer verifies the audit chain.
  await reviewer.goto(`/review/audit?study=${studyId}`);
  for (const action of ["study.design", "consent.save", "document.upload", "review.submit", "review.approve", "recruitment.open", "invitation.email"]) {
    await expect(reviewer.getByRole("cell", { name: action, exact: true }).first()).toBeVisible();
  }
  await reviewer.getByRole("button", { name: "Verify the chain" }).click();
  await expect(reviewer.getByRole("status")).toContainText("Intact");
});

test("an oversize upload (10 MB + 1 byte of PDF) is refused with 413 and nothing is stored", async () => {
  const r = await apiAsRole("researcher");
  const { study } = (await (await r.post("/api/studies", { data: { title: `Upload limits ${Date.now()}` } })).json()) as { study: { id: number } };
  const big = Buffer.concat([TINY_PDF, Buffer.alloc(10 * 1024 * 1024 + 1 - TINY_PDF.length, 0x20)]);
  const res = await r.post(`/api/studies/${study.id}/documents`, { multipart: { kind: "other", file: { name: "big.pdf", mimeType: "application/pdf", buffer: big } } });
  expect(res.status()).toBe(413);
  const list = (await (await r.get(`/api/studies/${study.id}/documents`)).json()) as { documents: unknown[] };
  expect(list.documents).toEqual([]);
  await r.dispose();
});
