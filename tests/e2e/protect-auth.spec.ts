import { request as httpRequest } from "node:http";
import { expect, request, test, type APIRequestContext, type Page } from "@playwright/test";
import { apiAs, apiAsRole, baseURL, linkInMail, signInWithForm } from "./helpers";

// Attacks on signing in and on the browser's pages, through the running server.

const unique = () => `${Date.now()}${Math.floor(Math.random() * 1e6)}`;

async function signInAttempt(ctx: APIRequestContext, email: string, password: string, forwardedFor: string): Promise<number> {
  const { csrfToken } = (await (await ctx.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const res = await ctx.post("/api/auth/callback/credentials", { form: { csrfToken, email, password, json: "true" }, headers: { "x-forwarded-for": forwardedFor } });
  return res.status();
}

test("parallel sign-ins on one account, each claiming another address, get no more than the account's 10 tries", async () => {
  const email = `target.${unique()}@harbourview-lab.example`;
  const clients = await Promise.all(Array.from({ length: 30 }, () => request.newContext({ baseURL })));
  const statuses = await Promise.all(clients.map((c, i) => signInAttempt(c, email, "guess-" + i, `198.51.100.${i + 1}, 203.0.113.${i + 1}`)));
  expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(20);
  expect(statuses.filter((s) => s !== 429).every((s) => s === 401)).toBe(true);
  for (const c of clients) await c.dispose();
});

/** An account made by the admin, with its password set through the invitation link. */
async function newResearcher(page: Page): Promise<{ email: string; password: string }> {
  const admin = await apiAsRole("admin");
  const email = `sessions.${unique()}@harbourview-lab.example`;
  expect((await admin.post("/api/admin/users", { data: { email, name: "Session Person", role: "researcher" } })).status()).toBe(201);
  await admin.dispose();
  await page.goto(await linkInMail(email, /account is ready/));
  await page.getByLabel("New password").fill("first-password-123");
  await page.getByLabel("The same again").fill("first-password-123");
  await page.getByRole("button", { name: "Set password" }).click();
  await expect(page.getByRole("status")).toContainText("Your password is set");
  return { email, password: "first-password-123" };
}

test("a password reset ends the sessions signed in before it; so does a deactivation", async ({ page }) => {
  const who = await newResearcher(page);
  const before = await apiAs(who.email, who.password); // e.g. a stolen cookie
  expect((await before.get("/api/me")).status()).toBe(200);
  await page.goto("/reset");
  await page.getByLabel("E-mail").fill(who.email);
  await page.getByRole("button", { name: "Send the link" }).click();
  await expect(page.getByRole("status")).toContainText("on its way");
  await page.goto(await linkInMail(who.email, /reset your password/));
  await page.getByLabel("New password").fill("second-password-456");
  await page.getByLabel("The same again").fill("second-password-456");
  await page.getByRole("button", { name: "Set password" }).click();
  await expect(page.getByRole("status")).toContainText("Your password is set");
  expect((await before.get("/api/me")).status()).toBe(401);
  await before.dispose();

  const after = await apiAs(who.email, "second-password-456");
  const admin = await apiAsRole("admin");
  const { users } = (await (await admin.get("/api/admin/users")).json()) as { users: { id: number; email: string }[] };
  const id = users.find((u) => u.email === who.email)!.id;
  expect((await admin.patch(`/api/admin/users/${id}`, { data: { role: "researcher", active: false } })).status()).toBe(200);
  expect((await after.get("/api/me")).status()).toBe(401);
  for (const c of [after, admin]) await c.dispose();
});

test("a reset request answers the same words for an account that exists and one that does not", async ({ page }) => {
  const answer = async (email: string) => {
    await page.goto("/reset");
    await page.getByLabel("E-mail").fill(email);
    await page.getByRole("button", { name: "Send the link" }).click();
    return (await page.getByRole("status").textContent())?.trim();
  };
  expect(await answer("tomas@harbourview-lab.example")).toBe(await answer(`nobody.${unique()}@harbourview-lab.example`));
});

test("pages allow only scripts that carry the request's nonce: an injected inline script does not run", async ({ page }) => {
  const res = await page.goto("/signin");
  const csp = res!.headers()["content-security-policy"]!;
  const nonce = /'nonce-([^']+)'/.exec(csp)?.[1];
  expect(nonce).toBeTruthy();
  expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
  // Next's own scripts carry the nonce and run: the form is interactive
  const nonces = await page.locator("script").evaluateAll((ss) => ss.map((s) => (s as HTMLScriptElement).nonce));
  expect(nonces.length).toBeGreaterThan(0);
  expect(nonces.every((n) => n === nonce)).toBe(true);
  await signInWithForm(page, "tomas@harbourview-lab.example", "demo-research-tomas");
  await expect(page.getByRole("heading", { name: "Your studies" })).toBeVisible();
  // what an HTML injection would add: markup with an inline handler, and a parser-inserted inline script, neither with the nonce
  const ran = await page.evaluate(async () => {
    document.body.insertAdjacentHTML("beforeend", '<img alt="" src="/nothing-here.png" onerror="window.__injected = 1">');
    const frame = document.createElement("iframe"); // a same-origin document the attacker writes into inherits nothing: use this one
    void frame;
    document.open();
    document.write('<!doctype html><p>x</p><script>window.__written = 1<\/script>');
    document.close();
    await new Promise((r) => setTimeout(r, 500));
    const w = window as unknown as { __injected?: number; __written?: number };
    return { handler: w.__injected ?? null, written: w.__written ?? null };
  });
  expect(ran).toEqual({ handler: null, written: null });
});

test("a document upload without Content-Length cannot grow past the limit: the server answers 413 and stops reading", async () => {
  const researcher = await apiAsRole("researcher");
  const { study } = (await (await researcher.post("/api/studies", { data: { title: `Upload limit ${unique()}`, summary: "s" } })).json()) as { study: { id: number } };
  const cookie = (await researcher.storageState()).cookies.map((c) => `${c.name}=${c.value}`).join("; ");
  const url = new URL(`/api/studies/${study.id}/documents`, baseURL);
  const { status, sentMb } = await new Promise<{ status: number; sentMb: number }>((resolve, reject) => {
    let sent = 0, done = false;
    const req = httpRequest({ host: url.hostname, port: url.port, path: url.pathname, method: "POST", headers: { cookie, "content-type": "multipart/form-data; boundary=x", "transfer-encoding": "chunked" } }, (res) => {
      done = true;
      res.resume();
      resolve({ status: res.statusCode ?? 0, sentMb: sent / 1024 / 1024 });
      req.destroy();
    });
    req.on("error", (e) => (done ? undefined : reject(e)));
    const chunk = Buffer.alloc(256 * 1024, 0x61);
    const pump = (): void => {
      while (!done && sent < 200 * 1024 * 1024) {
        sent += chunk.length;
        if (!req.write(chunk)) return void req.once("drain", pump);
      }
      if (!done) req.end();
    };
    req.write("--x\r\ncontent-disposition: form-data; name=\"file\"; filename=\"a.pdf\"\r\ncontent-type: application/pdf\r\n\r\n%PDF-1.4\n");
    pump();
  });
  expect(status).toBe(413);
  expect(sentMb).toBeLessThan(100); // it did not wait for the 200 MB
  await researcher.dispose();
});
