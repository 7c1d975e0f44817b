import { expect, request as playwrightRequest, type APIRequestContext, type Page } from "@playwright/test";
import { DEMO_PEOPLE } from "../../db/seeds/demo-scenario";
import type { FakeMessage } from "../../lib/mail/fake-message";

export const baseURL = `http://127.0.0.1:${process.env.PORT ?? 3100}`;
const mailURL = `http://127.0.0.1:${process.env.MAIL_FAKE_HTTP_PORT ?? 2581}/messages`;

export type DemoRole = "admin" | "researcher" | "reviewer";
export const demo = (role: DemoRole) => {
  const p = DEMO_PEOPLE.find((x) => x.role === role);
  if (!p) throw new Error(`no demo ${role}`);
  return p;
};

/** An API client signed in through next-auth's credentials flow, as the browser does it. */
export async function apiAs(email: string, password: string, base: string = baseURL): Promise<APIRequestContext> {
  const ctx = await playwrightRequest.newContext({ baseURL: base });
  const { csrfToken } = (await (await ctx.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const res = await ctx.post("/api/auth/callback/credentials", { form: { csrfToken, email, password, json: "true" } });
  expect(res.status(), `sign-in of ${email}`).toBe(200);
  const me = await ctx.get("/api/me");
  expect(me.status(), `session of ${email}`).toBe(200);
  return ctx;
}

export const apiAsRole = (role: DemoRole) => apiAs(demo(role).email, demo(role).password);

export async function signInWithForm(page: Page, email: string, password: string): Promise<void> {
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

/** Messages in the local SMTP fake addressed to `to`, newest last. */
export async function mailTo(to: string): Promise<FakeMessage[]> {
  const res = await fetch(mailURL);
  const all = (await res.json()) as FakeMessage[];
  return all.filter((m) => m.to.includes(to.toLowerCase()));
}

/** Waits for a message to `to` whose subject matches, and returns the first link in it. */
export async function linkInMail(to: string, subject: RegExp): Promise<string> {
  for (let i = 0; i < 40; i++) {
    const m = (await mailTo(to)).filter((x) => subject.test(x.subject)).at(-1);
    const link = m?.text.match(/https?:\/\/\S+/)?.[0];
    if (link) return link;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no mail to ${to} matching ${subject}`);
}
