import { execFileSync } from "node:child_process";
import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { knexConfig } from "@/knexfile";

// A database of its own: this test takes every migration down and up again.
const name = `${process.env.DB_NAME}_mig`;
let admin: Knex;
let db: Knex;

async function tables(): Promise<string[]> {
  const [rows] = (await db.raw("SELECT table_name AS t FROM information_schema.tables WHERE table_schema = ?", [name])) as [{ t: string }[]];
  return rows.map((r) => r.t).filter((t) => !t.startsWith("knex_")).sort();
}

beforeAll(async () => {
  admin = knex({ ...knexConfig(undefined, "owner"), connection: { ...(knexConfig(undefined, "owner").connection as object), database: undefined } });
  await admin.raw(`DROP DATABASE IF EXISTS \`${name}\``);
  await admin.raw(`CREATE DATABASE \`${name}\``);
  db = knex(knexConfig(name, "owner"));
});

/** Runs the knex CLI as a developer would (tsx loads the TypeScript migrations). */
function cli(...args: string[]): void {
  execFileSync("npx", ["tsx", "node_modules/knex/bin/cli.js", ...args], { env: { ...process.env, DB_NAME: name }, stdio: "pipe" });
}

afterAll(async () => {
  await db.destroy();
  await admin.raw(`DROP DATABASE IF EXISTS \`${name}\``);
  await admin.destroy();
});

describe("migrations", () => {
  it("go up, all the way down, and up again", async () => {
    cli("migrate:latest");
    const up = await tables();
    expect(up).toEqual(expect.arrayContaining(["users", "roles", "study_members", "audit_log", "password_tokens", "outgoing_mail", "studies", "rate_limits"]));
    expect(await db("roles").pluck("name")).toEqual(expect.arrayContaining(["admin", "researcher", "reviewer"]));
    cli("migrate:rollback", "--all");
    expect(await tables()).toEqual([]);
    cli("migrate:latest");
    expect(await tables()).toEqual(up);
  }, 180_000); // three runs of the knex CLI over every migration; slow on a busy machine

  it("every migration file exports up and down", async () => {
    const { readdirSync } = await import("node:fs");
    const files = readdirSync("db/migrations").filter((f) => f.endsWith(".ts"));
    expect(files.length).toBeGreaterThan(0);
    for (const f of files) {
      expect(f).toMatch(/^\d{14}_[a-z0-9_]+\.ts$/);
      const m = (await import(/* @vite-ignore */ `../../db/migrations/${f}`)) as { up?: unknown; down?: unknown };
      expect(typeof m.up, f).toBe("function");
      expect(typeof m.down, f).toBe("function");
    }
  });
});
