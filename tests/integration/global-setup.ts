import { execFileSync } from "node:child_process";

/**
 * Recreates the integration database (DB_NAME_it) and migrates it with the project's own script,
 * in a child process (knex loads TypeScript migrations through tsx, not through vitest).
 */
export default function setup(): void {
  const name = `${process.env.DB_NAME ?? "yawpoint_test"}_it`;
  execFileSync("npx", ["tsx", "scripts/db.ts", "up", "--fresh"], { env: { ...process.env, DB_NAME: name }, stdio: "inherit" });
}
