// Paced uploads for bench:ingest: each simulated session sends its batches one after another on its
// own keep-alive connection, at a fixed pace (a batch every `sessions / rate` seconds, each session
// starting at a random phase), waiting for each answer before the next, as the browser's queue does.
// Latency is counted from the moment a batch was due, not from when it could be sent, so a slow
// answer that delays the next batch is charged to that batch too (no coordinated omission).
// This is a harness, not domain logic.
import { Agent, request } from "node:http";
import { performance } from "node:perf_hooks";

export type PacedSession = { path: string; bodies: readonly string[] };
export type PacedResult = { fromDue: number[]; service: number[]; elapsed: number; stopped: boolean };

const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

function post(agent: Agent, base: URL, path: string, body: string): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const req = request({ agent, host: base.hostname, port: base.port, path, method: "POST", headers: { "content-type": "application/json", "content-length": Buffer.byteLength(body) } }, (res) => {
      let text = "";
      res.setEncoding("utf8");
      res.on("data", (c: string) => (text += c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, text }));
      res.on("error", reject);
    });
    req.on("error", reject);
    req.end(body);
  });
}

/**
 * Runs every session's batches at `ratePerS` batches per second in all; stops sending after `capMs`.
 * `onAnswer` sees each answer (status and body).
 */
export async function pacedSessions(url: string, sessions: readonly PacedSession[], ratePerS: number, capMs: number, onAnswer: (status: number, body: string) => void): Promise<PacedResult> {
  const base = new URL(url);
  const intervalMs = (1000 * sessions.length) / ratePerS;
  const fromDue: number[] = [];
  const service: number[] = [];
  const t0 = performance.now();
  let stopped = false;
  await Promise.all(sessions.map(async (s) => {
    const agent = new Agent({ keepAlive: true, maxSockets: 1 });
    const phase = Math.random() * intervalMs;
    try {
      for (let k = 0; k < s.bodies.length; k++) {
        const due = t0 + phase + k * intervalMs;
        if (due - t0 > capMs) {
          stopped = true;
          break;
        }
        const wait = due - performance.now();
        if (wait > 0) await sleep(wait);
        const sent = performance.now();
        const answer = await post(agent, base, s.path, s.bodies[k]!);
        const end = performance.now();
        fromDue.push(end - due);
        service.push(end - sent);
        onAnswer(answer.status, answer.text);
      }
    } finally {
      agent.destroy();
    }
  }));
  return { fromDue, service, elapsed: (performance.now() - t0) / 1000, stopped };
}
