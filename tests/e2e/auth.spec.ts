import { expect, test } from "@playwright/test";
import { demo, linkInMail, signInWithForm } from "./helpers";

const homes = [
  { role: "researcher", heading: "Your studies" },
  { role: "reviewer", heading: "Review queue" },
  { role: "admin", heading: "Users and roles" },
] as const;

for (const { role, heading } of homes) {
  test(`the ${role} signs in through the form, sees their home, and signs out`, async ({ page }) => {
    const who = demo(role);
    await signInWithForm(page, who.email, who.password);
    await expect(page.getByRole("heading", { name: heading })).toBeVisible();
    await expect(page.getByRole("navigation", { name: "Main" })).toBeVisible();
    // Navigation shows only the role's own areas.
    if (role !== "admin") await expect(page.getByRole("link", { name: "Users" })).toHaveCount(0);
    await page.getByRole("button", { name: "Sign out" }).click();
    await expect(page.getByRole("heading", { name: "Sign in" })).toBeVisible();
    await page.goto("/studies");
    await expect(page).toHaveURL(/\/signin/);
  });
}

test("a wrong password shows a message and no session", async ({ page }) => {
  await signInWithForm(page, demo("researcher").email, "not-the-password");
  await expect(page.getByText("The e-mail address or the password is wrong.")).toBeVisible();
  await page.goto("/studies");
  await expect(page).toHaveURL(/\/signin/);
});

test("a researcher cannot open the admin area", async ({ page }) => {
  const who = demo("researcher");
  await signInWithForm(page, who.email, who.password);
  await expect(page.getByRole("heading", { name: "Your studies" })).toBeVisible();
  await page.goto("/admin");
  await expect(page).toHaveURL(/\/studies$/);
});

test("the admin invites a user, who sets a password from the mail; a reset link works once", async ({ page, browser }) => {
  const email = `new.researcher.${Date.now()}@harbourview-lab.example`;
  const admin = demo("admin");
  await signInWithForm(page, admin.email, admin.password);
  await page.getByLabel("Name").fill("Noor Vance");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Role", { exact: true }).selectOption("researcher");
  await page.getByRole("button", { name: "Invite" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Invitation sent" })).toBeVisible();
  await expect(page.getByRole("cell", { name: email })).toBeVisible();

  const other = await browser.newContext();
  const p2 = await other.newPage();
  await p2.goto(await linkInMail(email, /account is ready/));
  await p2.getByLabel("New password").fill("first-password-123");
  await p2.getByLabel("The same again").fill("first-password-123");
  await p2.getByRole("button", { name: "Set password" }).click();
  await expect(p2.getByRole("status")).toContainText("Your password is set");
  await signInWithForm(p2, email, "first-password-123");
  await expect(p2.getByRole("heading", { name: "Your studies" })).toBeVisible();
  await p2.getByRole("button", { name: "Sign out" }).click();
  await expect(p2.getByRole("heading", { name: "Sign in" })).toBeVisible();

  // Password reset by e-mail.
  await p2.goto("/reset");
  await p2.getByLabel("E-mail").fill(email);
  await p2.getByRole("button", { name: "Send the link" }).click();
  await expect(p2.getByRole("status")).toContainText("on its way");
  const link = await linkInMail(email, /reset your password/);
  await p2.goto(link);
  await p2.getByLabel("New password").fill("second-password-456");
  await p2.getByLabel("The same again").fill("second-password-456");
  await p2.getByRole("button", { name: "Set password" }).click();
  await expect(p2.getByRole("status")).toContainText("Your password is set");
  await signInWithForm(p2, email, "second-password-456");
  await expect(p2.getByRole("heading", { name: "Your studies" })).toBeVisible();

  // The same link a second time is refused.
  await p2.goto(link);
  await p2.getByLabel("New password").fill("third-password-789");
  await p2.getByLabel("The same again").fill("third-password-789");
  await p2.getByRole("button", { name: "Set password" }).click();
  await expect(p2.getByText(/expired or has been used/)).toBeVisible();
  await other.close();
});
