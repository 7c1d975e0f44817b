// The production server (npm start, the browser tests and bench:ingest): what `next start` does,
// in WEB_CONCURRENCY processes sharing one port (node:cluster; default: one per CPU core, at most 4).
// One process of Next handles a request on one core only; participants' uploads are CPU work
// (parsing, checking, compressing answers), so a second process lets a 2-core server take twice
// the load. Nothing in the app keeps state in memory that another process would need: sessions
// are signed cookies, jobs and limits live in the database, caches are only caches.
// Usage: tsx scripts/serve.ts [-H host] [-p port]   (PORT and HOSTNAME from the environment otherwise)
import cluster from "node:cluster";
import { createServer } from "node:http";
import { availableParallelism } from "node:os";
import { resolve } from "node:path";
import next from "next";

/** lib/auth/rate-limit.ts PEER_HEADER (not imported: this script loads before the app's modules). */
const PEER_HEADER = "x-yawpoint-peer";

const argv = process.argv.slice(2);
const flag = (names: string[]): string | undefined => {
  const i = argv.findIndex((a) => names.includes(a));
  return i >= 0 ? argv[i + 1] : undefined;
};
const hostname = flag(["-H", "--hostname"]) ?? process.env.HOSTNAME ?? "127.0.0.1";
const port = Number(flag(["-p", "--port"]) ?? process.env.PORT ?? 3000);
const requested = Number(process.env.WEB_CONCURRENCY ?? Math.min(4, availableParallelism()));
const processes = Number.isInteger(requested) && requested >= 1 ? requested : 1;

async function serveHere(): Promise<void> {
  const app = next({ dev: false, hostname, port, dir: resolve(import.meta.dirname, "..") });
  const handle = app.getRequestHandler();
  await app.prepare(); // runs instrumentation.ts: a bad environment stops the process here, with its message
  // The connection's own peer address, for the rate limits (lib/auth/rate-limit.ts clientAddress);
  // whatever a client sent under that name is replaced, so it cannot choose its address.
  const server = createServer((req, res) => {
    req.headers[PEER_HEADER] = req.socket.remoteAddress ?? "unknown";
    for (let i = req.rawHeaders.length - 2; i >= 0; i -= 2) if (req.rawHeaders[i]!.toLowerCase() === PEER_HEADER) req.rawHeaders.splice(i, 2);
    void handle(req, res);
  });
  server.listen(port, hostname, () => {
    if (process.send) process.send("ready");
    else console.log(`Yawpoint serving on http://${hostname}:${port}`);
  });
  const stop = (): void => {
    server.close(() => process.exit(0));
    setTimeout(() => process.exit(0), 5_000).unref();
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}

function superviseWorkers(): void {
  let ready = 0, stopping = false;
  const restarts: number[] = [];
  const fork = (): void => {
    const worker = cluster.fork();
    let up = false;
    worker.on("message", (m) => {
      if (m !== "ready" || up) return;
      up = true;
      if (++ready === processes) console.log(`Yawpoint serving on http://${hostname}:${port} (${processes} processes)`);
    });
    worker.on("exit", (code, signal) => {
      if (stopping) return;
      if (!up) {
        // a worker that never started (bad environment, port taken, no build): stop everything with its code
        stopping = true;
        for (const w of Object.values(cluster.workers ?? {})) w?.kill("SIGTERM");
        process.exit(code ?? 1);
      }
      ready--;
      const now = Date.now();
      restarts.push(now);
      while (restarts.length && now - restarts[0]! > 60_000) restarts.shift();
      console.error(`serve: a server process stopped (${signal ?? `exit ${code}`}); ${restarts.length > 5 ? "too many restarts in a minute, stopping" : "starting another"}`);
      if (restarts.length > 5) return void shutdown(1);
      fork();
    });
  };
  const shutdown = (code: number): void => {
    stopping = true;
    const workers = Object.values(cluster.workers ?? {});
    if (workers.length === 0) process.exit(code);
    let left = workers.length;
    for (const w of workers) {
      w?.once("exit", () => --left === 0 && process.exit(code));
      w?.kill("SIGTERM");
    }
    setTimeout(() => process.exit(code), 6_000).unref();
  };
  process.on("SIGTERM", () => shutdown(0));
  process.on("SIGINT", () => shutdown(0));
  for (let i = 0; i < processes; i++) fork();
}

if (cluster.isPrimary && processes > 1) superviseWorkers();
else await serveHere();
