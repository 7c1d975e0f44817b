/**
 * A local SMTP fake on loopback, standing in for a mail service in development and tests.
 * It accepts every message (smtp-server), parses it (mailparser) and keeps it in a JSON-lines file;
 * a small HTTP API on loopback lists them: GET /messages, DELETE /messages, GET /health.
 *
 *   tsx scripts/mail-fake.ts            run in the foreground
 *   tsx scripts/mail-fake.ts --daemon   start in the background unless it already answers
 *   tsx scripts/mail-fake.ts --stop     stop the background one by its pid file
 */
import { spawn } from "node:child_process";
import { appendFileSync, existsSync, mkdirSync, openSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createServer } from "node:http";
import { resolve } from "node:path";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";
import { parseEnv } from "../lib/env";
import type { FakeMessage } from "../lib/mail/fake-message";

const env = parseEnv(process.env);
const root = resolve(import.meta.dirname, "..");
const dataDir = resolve(root, ".data");
const store = resolve(dataDir, `mail-${env.SMTP_PORT}.jsonl`);
const pidFile = resolve(dataDir, `mail-fake-${env.SMTP_PORT}.pid`);
const healthUrl = `http://127.0.0.1:${env.MAIL_FAKE_HTTP_PORT}/health`;

async function answers(): Promise<boolean> {
  try {
    return (await fetch(healthUrl, { signal: AbortSignal.timeout(1000) })).ok;
  } catch {
    return false;
  }
}

function readAll(): FakeMessage[] {
  if (!existsSync(store)) return [];
  return readFileSync(store, "utf8").split("\n").filter(Boolean).map((l) => JSON.parse(l) as FakeMessage);
}

async function serve(): Promise<void> {
  mkdirSync(dataDir, { recursive: true });
  let nextId = readAll().length + 1;
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const to = session.envelope.rcptTo.map((r) => r.address);
          const message: FakeMessage = {
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: mail.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ""),
            to,
            subject: mail.subject ?? "",
            text: mail.text ?? "",
            html: typeof mail.html === "string" ? mail.html : null,
          };
          appendFileSync(store, JSON.stringify(message) + "\n");
          callback();
        })
        .catch((e: unknown) => callback(e instanceof Error ? e : new Error(String(e))));
    },
  });
  smtp.listen(env.SMTP_PORT, "127.0.0.1");
  createServer((req, res) => {
    res.setHeader("content-type", "application/json");
    if (req.url === "/health") return res.end('{"ok":true}');
    if (req.url?.startsWith("/messages") && req.method === "GET") return res.end(JSON.stringify(readAll()));
    if (req.url === "/messages" && req.method === "DELETE") {
      writeFileSync(store, "");
      return res.end('{"ok":true}');
    }
    res.statusCode = 404;
    res.end('{"error":"not found"}');
  }).listen(env.MAIL_FAKE_HTTP_PORT, "127.0.0.1");
  writeFileSync(pidFile, String(process.pid));
  console.log(`mail fake: SMTP on 127.0.0.1:${env.SMTP_PORT}, messages at http://127.0.0.1:${env.MAIL_FAKE_HTTP_PORT}/messages`);
}

async function daemon(): Promise<void> {
  if (await answers()) {
    console.log(`mail fake: already running (SMTP 127.0.0.1:${env.SMTP_PORT})`);
    return;
  }
  mkdirSync(dataDir, { recursive: true });
  const out = openSync(resolve(dataDir, `mail-fake-${env.SMTP_PORT}.log`), "a");
  const child = spawn(process.execPath, [...process.execArgv, import.meta.filename], { detached: true, stdio: ["ignore", out, out], env: process.env });
  child.unref();
  for (let i = 0; i < 80; i++) {
    if (await answers()) {
      console.log(`mail fake: started (SMTP 127.0.0.1:${env.SMTP_PORT}, pid ${child.pid})`);
      return;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error("mail fake: did not start within 20 s");
}

function stop(): void {
  if (!existsSync(pidFile)) return console.log("mail fake: not running");
  const pid = Number(readFileSync(pidFile, "utf8"));
  try {
    process.kill(pid, "SIGTERM");
    console.log(`mail fake: stopped (pid ${pid})`);
  } catch {
    console.log("mail fake: not running");
  }
  rmSync(pidFile, { force: true });
}

const main = process.argv.includes("--daemon") ? daemon : process.argv.includes("--stop") ? async () => stop() : serve;
main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
