import { NextRequest } from "next/server";
import { afterEach, describe, expect, it } from "vitest";
import { readFormLimited } from "@/lib/api/body";
import { parseEnv } from "@/lib/env";
import { messagesForViewer } from "@/lib/mail/fake";
import proxy from "@/proxy";

describe("mail fake", () => {
  it("is on by default only in development; production sends through the configured server", () => {
    const secrets = { NEXTAUTH_SECRET: "0123456789abcdef0123", PARTICIPANT_DATA_KEY: "0123456789abcdef0123", AUDIT_KEY: "0123456789abcdef0123" };
    expect(parseEnv({ NODE_ENV: "production", ...secrets }).MAIL_FAKE).toBe(false);
    expect(parseEnv({ NODE_ENV: "development" }).MAIL_FAKE).toBe(true);
    expect(parseEnv({ NODE_ENV: "production", ...secrets, MAIL_FAKE: "true" }).MAIL_FAKE).toBe(true);
  });

  it("shows the admin nobody else's password or session link", () => {
    const base = { id: 1, receivedAt: "", from: "no-reply@x.example", subject: "s", html: null };
    const shown = messagesForViewer([
      { ...base, to: ["victim@lab.example"], text: "Open http://127.0.0.1:3000/reset/AbCdEfGhIjKlMnOpQrStUvWxYz012345 within one hour" },
      { ...base, to: ["p@mailbox.example"], text: "Your link: http://127.0.0.1:3000/s/AbCdEfGhIjKlMnOpQrSt and the study http://127.0.0.1:3000/s/public/PublicLinkToken0001" },
      { ...base, to: ["Admin@Lab.example"], text: "Open http://127.0.0.1:3000/reset/MyOwnTokenMyOwnTokenMyOwn" },
    ], "admin@lab.example");
    expect(shown[0]!.text).not.toContain("AbCdEfGh");
    expect(shown[0]!.text).toContain("/reset/[hidden");
    expect(shown[1]!.text).not.toContain("/s/AbCdEf");
    expect(shown[1]!.text).toContain("/s/public/PublicLinkToken0001"); // a public link acts for nobody
    expect(shown[2]!.text).toContain("MyOwnTokenMyOwnToken");
  });
});

describe("document upload body", () => {
  it("stops reading an endless body without Content-Length at the limit (413), instead of buffering it", async () => {
    let sent = 0;
    const endless = new ReadableStream<Uint8Array>({
      pull(controller) {
        sent += 65_536;
        controller.enqueue(new Uint8Array(65_536));
      },
    });
    const request = new Request("http://x.example/upload", { method: "POST", body: endless, headers: { "content-type": "multipart/form-data; boundary=b" }, duplex: "half" } as RequestInit);
    await expect(readFormLimited(request, 1024 * 1024)).rejects.toMatchObject({ status: 413 });
    expect(sent).toBeLessThan(4 * 1024 * 1024);
  });
});

describe("proxy: CSP with a nonce per request, HSTS behind TLS", () => {
  const saved = process.env.NEXTAUTH_URL;
  afterEach(() => {
    process.env.NEXTAUTH_URL = saved;
  });

  it("allows scripts only with a fresh nonce, never inline ones without it", async () => {
    const a = (await proxy(new NextRequest("http://127.0.0.1:3000/signin"))).headers.get("content-security-policy")!;
    const b = (await proxy(new NextRequest("http://127.0.0.1:3000/signin"))).headers.get("content-security-policy")!;
    const scripts = (csp: string) => csp.split(";").map((d) => d.trim()).find((d) => d.startsWith("script-src"))!;
    expect(scripts(a)).toMatch(/'nonce-[A-Za-z0-9+/=]{16,}'/);
    expect(scripts(a)).not.toContain("unsafe-inline");
    expect(scripts(a)).not.toBe(scripts(b));
  });

  it("sends Strict-Transport-Security only when the public address is https", async () => {
    process.env.NEXTAUTH_URL = "https://yawpoint.lab.example";
    expect((await proxy(new NextRequest("https://yawpoint.lab.example/signin"))).headers.get("strict-transport-security")).toMatch(/^max-age=\d{7,}/);
    process.env.NEXTAUTH_URL = "http://127.0.0.1:3000";
    expect((await proxy(new NextRequest("http://127.0.0.1:3000/signin"))).headers.get("strict-transport-security")).toBeNull();
  });
});
