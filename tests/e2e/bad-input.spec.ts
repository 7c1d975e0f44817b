import { expect, test } from "@playwright/test";
import { apiAsRole } from "./helpers";

test("malformed JSON, wrong types and an oversized body get a 4xx naming the problem, and nothing changes", async () => {
  const admin = await apiAsRole("admin");
  const researcher = await apiAsRole("researcher");
  const before = await (await admin.get("/api/admin/users")).json();
  const studiesBefore = await (await researcher.get("/api/studies")).json();
  const target = (before as { users: { id: number; email: string }[] }).users.find((u) => u.email.startsWith("priya@"))!;

  const malformed = await admin.fetch(`/api/admin/users/${target.id}`, { method: "PATCH", headers: { "content-type": "application/json" }, data: Buffer.from('{"role": "admin",') });
  expect(malformed.status()).toBe(400);
  expect((await malformed.json()).error.message).toMatch(/Malformed JSON/);

  const wrongType = await admin.fetch(`/api/admin/users/${target.id}`, { method: "PATCH", data: { role: "admin", active: "yes" } });
  expect(wrongType.status()).toBe(422);
  expect((await wrongType.json()).error.message).toMatch(/^active:/);

  const unknownRole = await admin.fetch(`/api/admin/users/${target.id}`, { method: "PATCH", data: { role: "participant", active: true } });
  expect(unknownRole.status()).toBe(422);

  const huge = await admin.fetch(`/api/admin/users/${target.id}`, { method: "PATCH", headers: { "content-type": "application/json" }, data: Buffer.from(JSON.stringify({ role: "admin", active: true, pad: "x".repeat(1_100_000) })) });
  expect(huge.status()).toBe(413);

  const notJson = await admin.fetch(`/api/admin/users/${target.id}`, { method: "PATCH", headers: { "content-type": "text/plain" }, data: Buffer.from("role=admin") });
  expect(notJson.status()).toBe(415);

  const badId = await admin.fetch(`/api/admin/users/not-a-number`, { method: "PATCH", data: { role: "admin", active: true } });
  expect(badId.status()).toBe(422);

  const shortTitle = await researcher.post("/api/studies", { data: { title: "x" } });
  expect(shortTitle.status()).toBe(422);
  expect((await shortTitle.json()).error.message).toMatch(/^title:/);

  expect(await (await admin.get("/api/admin/users")).json()).toEqual(before);
  expect(await (await researcher.get("/api/studies")).json()).toEqual(studiesBefore);
});

test("failed sign-ins are limited per account and address: the 11th answers 429 with a plain message", async ({ request }) => {
  const email = `nobody.${Date.now()}@harbourview-lab.example`;
  const { csrfToken } = await (await request.get("/api/auth/csrf")).json();
  for (let i = 0; i < 10; i++) {
    const res = await request.post("/api/auth/callback/credentials", { form: { csrfToken, email, password: "wrong-password", json: "true" } });
    expect(res.status()).toBe(401);
  }
  const limited = await request.post("/api/auth/callback/credentials", { form: { csrfToken, email, password: "wrong-password", json: "true" } });
  expect(limited.status()).toBe(429);
  expect((await limited.json()).error.message).toMatch(/Too many failed sign-ins/);
});
