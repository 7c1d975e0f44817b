import { defineConfig, devices } from "@playwright/test";

const port = Number(process.env.PORT ?? 3100);
const baseURL = `http://127.0.0.1:${port}`;

// Debian's Chromium, never a downloaded browser (scripts/setup.sh installs it with apt-get).
export default defineConfig({
  testDir: "./tests/e2e",
  fullyParallel: false,
  workers: process.env.PW_WORKERS ? Number(process.env.PW_WORKERS) : 2,
  retries: 0,
  timeout: 60_000,
  // A page that answers after a password check (bcrypt) or a first server render can take over
  // 5 s on a loaded 2-core machine; 15 s per expectation keeps such waits from failing a run.
  expect: { timeout: 15_000 },
  reporter: [["list"], ["json", { outputFile: "reports/playwright.json" }]],
  use: {
    baseURL,
    trace: "retain-on-failure",
    launchOptions: { executablePath: "/usr/bin/chromium", args: ["--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"] },
  },
  projects: [{ name: "chromium", use: { ...devices["Desktop Chrome"], channel: undefined } }],
  webServer: {
    command: `npx tsx scripts/serve.ts -H 127.0.0.1 -p ${port}`, // the production server, as npm start runs it
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    timeout: 120_000,
    env: {
      NODE_ENV: "production",
      NEXTAUTH_URL: baseURL,
      NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? "test-secret-not-for-production-0000",
      PARTICIPANT_DATA_KEY: process.env.PARTICIPANT_DATA_KEY ?? "development-only-participant-data-key",
      // the keys the seed used: npm test exports its own; run by hand, the seed used the development defaults
      AUDIT_KEY: process.env.AUDIT_KEY ?? "development-only-audit-key",
      MAIL_FAKE: "true", // the tests read mail from the local fake
      DB_NAME: process.env.DB_NAME ?? "yawpoint_test",
      SMTP_PORT: process.env.SMTP_PORT ?? "2526",
      MAIL_FAKE_HTTP_PORT: process.env.MAIL_FAKE_HTTP_PORT ?? "2581",
    },
  },
});
