import { spawn } from "node:child_process";
import { expect, test } from "@playwright/test";

// The production server (scripts/serve.ts, what npm start runs): with its required secrets
// missing it must not start, and say which ones, even though it runs several processes.
test("the server refuses to start without NEXTAUTH_SECRET, PARTICIPANT_DATA_KEY and AUDIT_KEY, naming each", async () => {
  const port = Number(process.env.PORT ?? 3100) + 57;
  const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: "production", WEB_CONCURRENCY: "2" };
  delete env.NEXTAUTH_SECRET;
  delete env.PARTICIPANT_DATA_KEY;
  delete env.AUDIT_KEY;
  const child = spawn("npx", ["tsx", "scripts/serve.ts", "-H", "127.0.0.1", "-p", String(port)], { env, stdio: ["ignore", "pipe", "pipe"] });
  let output = "";
  child.stdout.on("data", (d: Buffer) => (output += d.toString()));
  child.stderr.on("data", (d: Buffer) => (output += d.toString()));
  const code = await new Promise<number | null>((resolve) => child.on("exit", resolve));
  expect(code).toBe(1);
  expect(output).toContain("Yawpoint cannot start.");
  expect(output).toContain("NEXTAUTH_SECRET");
  expect(output).toContain("PARTICIPANT_DATA_KEY");
  expect(output).toContain("AUDIT_KEY");
  expect(output).not.toContain("serving on");
  // nothing is left listening on the port
  await expect(fetch(`http://127.0.0.1:${port}/api/health`)).rejects.toThrow();
});
