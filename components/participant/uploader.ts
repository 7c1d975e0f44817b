import { retryDelayMs, uploadOutcome } from "@/lib/runner/upload";
import { postSession } from "./api";
import type { SessionStore } from "./store";

export interface UploadStatus {
  pending: number;
  refused: number;
  sending: boolean;
  /** The last attempt failed for lack of network (or a server error) and will be retried. */
  waiting: boolean;
  stopped: boolean;
}

export interface Uploader {
  kick(): void;
  stop(): void;
  status(): UploadStatus;
}

/**
 * Sends the queued sequences one at a time: stored (2xx, also a duplicate) → removed;
 * refused (422) → kept and marked; withdrawn/unknown (410/404) → the queue stops; anything else,
 * or no network → retried with exponential backoff, and at once when the browser is online again.
 */
export function createUploader(token: string, store: SessionStore, onChange: (s: UploadStatus) => void): Uploader {
  let running = false, stopped = false, attempt = 0, timer: ReturnType<typeof setTimeout> | null = null;
  const status: UploadStatus = { pending: 0, refused: 0, sending: false, waiting: false, stopped: false };
  const report = async (): Promise<void> => {
    const all = await store.batches();
    status.pending = all.filter((b) => b.state === "pending").length;
    status.refused = all.filter((b) => b.state === "refused").length;
    onChange({ ...status });
  };
  const run = async (): Promise<void> => {
    if (running || stopped) return;
    running = true;
    status.sending = true;
    try {
      for (;;) {
        const next = (await store.batches()).filter((b) => b.state === "pending").sort((a, b) => a.key.localeCompare(b.key))[0];
        if (!next || stopped) break;
        let code = 0, text = "";
        try {
          const res = await postSession(token, "sequences", next.batch);
          code = res.status;
          if (code === 422) text = await res.text();
        } catch {
          code = 0;
        }
        const outcome = uploadOutcome(code);
        if (outcome === "stored") {
          await store.remove(next.key);
          attempt = 0;
          status.waiting = false;
        } else if (outcome === "refused") {
          await store.update({ ...next, state: "refused", attempts: next.attempts + 1, refusal: text.slice(0, 500) });
        } else if (outcome === "stop") {
          stopped = true;
          status.stopped = true;
        } else {
          await store.update({ ...next, attempts: next.attempts + 1 });
          status.waiting = true;
          timer = setTimeout(() => void run(), retryDelayMs(attempt++, Math.random()));
          break;
        }
        await report();
      }
    } finally {
      running = false;
      status.sending = false;
      await report();
    }
  };
  const online = (): void => {
    if (timer) clearTimeout(timer);
    attempt = 0;
    void run();
  };
  window.addEventListener("online", online);
  void report();
  return {
    kick: () => void run(),
    stop() {
      stopped = true;
      status.stopped = true;
      if (timer) clearTimeout(timer);
      window.removeEventListener("online", online);
    },
    status: () => ({ ...status }),
  };
}
