/**
 * The project's own MariaDB: installs it (apt-get, as root) when missing, initialises a
 * project-local data directory, starts it on 127.0.0.1, creates the database and the app user,
 * runs the migrations. Idempotent: a second `up` finds the server running and reuses it.
 *
 *   tsx scripts/db.ts up [--fresh]   start (and with --fresh drop and recreate DB_NAME first)
 *   tsx scripts/db.ts stop           stop the server by its pid file
 *   tsx scripts/db.ts status
 *
 * It never touches a system MariaDB: its own data directory, socket and port (default 3307).
 * DB_DATA_DIR names another data directory (the log beside it): a second, separate instance on
 * another DB_PORT, which the reliability tests start, restart and stop on their own.
 */
import { spawn, spawnSync } from "node:child_process";
import { existsSync, mkdirSync, openSync, readFileSync } from "node:fs";
import { resolve } from "node:path";
import knex from "knex";
import { knexConfig } from "../knexfile";
import { parseEnv } from "../lib/env";

const env = parseEnv(process.env);
const root = resolve(import.meta.dirname, "..");
const dataDir = process.env.DB_DATA_DIR ? resolve(process.env.DB_DATA_DIR) : resolve(root, ".data/mariadb");
const socket = resolve(dataDir, "mysqld.sock");
const pidFile = resolve(dataDir, "mysqld.pid");
const logFile = process.env.DB_DATA_DIR ? `${dataDir}.log` : resolve(root, ".data/mariadb.log");

function which(cmd: string): string | null {
  for (const dir of ["/usr/sbin", "/usr/bin", "/usr/local/sbin", "/usr/local/bin", ...(process.env.PATH ?? "").split(":")]) {
    if (dir && existsSync(`${dir}/${cmd}`)) return `${dir}/${cmd}`;
  }
  return null;
}

function run(cmd: string, args: string[], input?: string): string {
  const r = spawnSync(cmd, args, { input, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(" ")} failed: ${r.stderr || r.stdout}`);
  return r.stdout;
}

function ensureInstalled(): void {
  if (which("mariadbd") && which("mariadb-install-db")) return;
  if (process.getuid?.() !== 0) {
    console.error("MariaDB is not installed. Install it once with:\n  sudo apt-get update && sudo apt-get install -y mariadb-server\nthen run this command again.");
    process.exit(1);
  }
  console.log("db: installing mariadb-server with apt-get (once per machine)...");
  const opts = { stdio: "inherit" as const, env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } };
  if (spawnSync("apt-get", ["update", "-qq"], opts).status !== 0) throw new Error("apt-get update failed");
  if (spawnSync("apt-get", ["install", "-y", "-qq", "mariadb-server"], opts).status !== 0) throw new Error("apt-get install mariadb-server failed");
}

function pidAlive(): number | null {
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, "utf8").trim());
  if (!Number.isInteger(pid) || pid <= 0) return null;
  try {
    process.kill(pid, 0);
    return pid;
  } catch {
    return null;
  }
}

function ping(): boolean {
  return spawnSync(which("mariadb-admin") ?? "mariadb-admin", ["--socket", socket, "-uroot", "ping"], { encoding: "utf8" }).status === 0;
}

async function waitFor(check: () => boolean, what: string, seconds = 60): Promise<void> {
  const until = Date.now() + seconds * 1000;
  while (Date.now() < until) {
    if (check()) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`db: ${what} did not happen within ${seconds} s (see ${logFile})`);
}

function sql(statements: string): void {
  run(which("mariadb") ?? "mariadb", ["--socket", socket, "-uroot"], statements);
}

/** Rows of a query as root (tab-separated, no header). */
function rows(query: string): string[][] {
  return run(which("mariadb") ?? "mariadb", ["--socket", socket, "-uroot", "-N", "-B", "-e", query]).split("\n").filter(Boolean).map((l) => l.split("\t"));
}

const quoted = (s: string): string => s.replace(/['`\\]/g, "");
const HOSTS = ["127.0.0.1", "localhost"];

/**
 * The two database users: the owner (DB_OWNER_USER) holds every right on DB_NAME and runs the
 * migrations; the application (DB_USER) gets, table by table, only what it needs — rows to read
 * and write, the audit log to read and append to (no UPDATE, no DELETE), the migrations' tables to
 * read — and EXECUTE for the stored procedures; no schema changes. Grants are set after every
 * migration run, so a new table gets them; rights on whole databases the application held before
 * (every right, in earlier versions) are taken back, except EXECUTE.
 */
function grantRights(tables: readonly string[]): void {
  const app = quoted(env.DB_USER), db = quoted(env.DB_NAME);
  const held = rows(`SELECT Db, Host FROM mysql.db WHERE User = '${app}'`);
  const statements = held.map(([d, h]) => `REVOKE ALL PRIVILEGES ON \`${d}\`.* FROM '${app}'@'${h}'; GRANT EXECUTE ON \`${d}\`.* TO '${app}'@'${h}';`);
  for (const h of HOSTS) {
    statements.push(`GRANT EXECUTE ON \`${db}\`.* TO '${app}'@'${h}';`);
    for (const t of tables) {
      const rights = t === "audit_log" ? "SELECT, INSERT" : t.startsWith("knex_") ? "SELECT" : "SELECT, INSERT, UPDATE, DELETE";
      statements.push(`GRANT ${rights} ON \`${db}\`.\`${t}\` TO '${app}'@'${h}';`);
    }
  }
  sql(statements.join("\n") + "\nFLUSH PRIVILEGES;");
}

async function start(): Promise<void> {
  ensureInstalled();
  mkdirSync(dataDir, { recursive: true });
  if (!existsSync(resolve(dataDir, "mysql"))) {
    console.log(`db: initialising ${dataDir}`);
    run(which("mariadb-install-db")!, ["--user=root", `--datadir=${dataDir}`, "--skip-test-db", "--auth-root-authentication-method=normal"]);
  }
  if (pidAlive() && ping()) {
    console.log(`db: MariaDB already running on 127.0.0.1:${env.DB_PORT} (pid ${pidAlive()})`);
  } else {
    const out = openSync(logFile, "a");
    const child = spawn(which("mariadbd")!, [
      "--no-defaults",
      "--user=root",
      `--datadir=${dataDir}`,
      `--port=${env.DB_PORT}`,
      "--bind-address=127.0.0.1",
      `--socket=${socket}`,
      `--pid-file=${pidFile}`,
      "--character-set-server=utf8mb4",
      "--collation-server=utf8mb4_unicode_ci",
      "--innodb-buffer-pool-size=256M",
      "--skip-name-resolve",
    ], { detached: true, stdio: ["ignore", out, out] });
    child.unref();
    await waitFor(() => ping(), "MariaDB start");
    console.log(`db: MariaDB started on 127.0.0.1:${env.DB_PORT} (pid ${pidAlive()})`);
  }
  const user = quoted(env.DB_USER), password = quoted(env.DB_PASSWORD);
  const owner = quoted(env.DB_OWNER_USER), ownerPassword = quoted(env.DB_OWNER_PASSWORD);
  const fresh = process.argv.includes("--fresh");
  sql(`${fresh ? `DROP DATABASE IF EXISTS \`${env.DB_NAME}\`;` : ""}
CREATE DATABASE IF NOT EXISTS \`${env.DB_NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
${HOSTS.map((h) => `CREATE USER IF NOT EXISTS '${user}'@'${h}' IDENTIFIED BY '${password}';
CREATE USER IF NOT EXISTS '${owner}'@'${h}' IDENTIFIED BY '${ownerPassword}';
GRANT ALL PRIVILEGES ON \`${env.DB_NAME}%\`.* TO '${owner}'@'${h}';`).join("\n")}
FLUSH PRIVILEGES;`);
  const conn = knex(knexConfig(env.DB_NAME, "owner"));
  try {
    const [, applied] = (await conn.migrate.latest()) as [number, string[]];
    const [tables] = (await conn.raw("SELECT table_name AS t FROM information_schema.tables WHERE table_schema = ?", [env.DB_NAME])) as [{ t: string }[]];
    grantRights(tables.map((r) => r.t));
    console.log(`db: database ${env.DB_NAME} ready${fresh ? " (recreated)" : ""}; ${applied.length} migration(s) applied; ${env.DB_USER} may not change the schema or the audit log`);
  } finally {
    await conn.destroy();
  }
}

async function stop(): Promise<void> {
  const pid = pidAlive();
  if (!pid) {
    console.log("db: not running");
    return;
  }
  process.kill(pid, "SIGTERM");
  await waitFor(() => pidAlive() === null, "MariaDB stop", 60);
  console.log(`db: stopped (pid ${pid})`);
}

const command = process.argv[2];
const actions: Record<string, () => Promise<void>> = {
  up: start,
  stop,
  status: async () => console.log(pidAlive() && ping() ? `db: running on 127.0.0.1:${env.DB_PORT} (pid ${pidAlive()})` : "db: not running"),
};
const action = command ? actions[command] : undefined;
if (!action) {
  console.error("usage: tsx scripts/db.ts up [--fresh] | stop | status");
  process.exit(2);
}
action().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
