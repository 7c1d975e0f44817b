"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import type { ChecksAnswer, ChecksRequest } from "./checksProtocol";

type DistributiveOmit<T, K extends keyof T> = T extends unknown ? Omit<T, K> : never;
type Pending = { phase: string; done: number; total: number } | null;

/**
 * One Web Worker for a kind of check; a new request replaces a running one (the worker is
 * restarted, so a long power run stops at once).
 */
export function useChecksWorker<A extends ChecksAnswer>() {
  const worker = useRef<Worker | null>(null);
  const next = useRef(1);
  const [progress, setProgress] = useState<Pending>(null);
  const [answer, setAnswer] = useState<A | { kind: "error"; message: string } | null>(null);

  useEffect(() => () => worker.current?.terminate(), []);

  const run = useCallback((req: DistributiveOmit<ChecksRequest, "id">) => {
    worker.current?.terminate();
    const w = new Worker(new URL("./checks.worker.ts", import.meta.url), { type: "module" });
    worker.current = w;
    const id = next.current++;
    setProgress({ phase: "starting", done: 0, total: 1 });
    w.onmessage = (e: MessageEvent<ChecksAnswer>) => {
      const a = e.data;
      if (a.id !== id) return;
      if (a.kind === "progress") setProgress({ phase: a.phase, done: a.done, total: a.total });
      else {
        setProgress(null);
        setAnswer(a as A);
        w.terminate();
        if (worker.current === w) worker.current = null;
      }
    };
    w.onerror = (e) => {
      setProgress(null);
      setAnswer({ kind: "error", message: e.message || "The check stopped." });
    };
    w.postMessage({ ...req, id } as ChecksRequest);
  }, []);

  const cancel = useCallback(() => {
    worker.current?.terminate();
    worker.current = null;
    setProgress(null);
  }, []);

  return { run, cancel, progress, answer };
}

/** A progress bar for a running check. */
export function progressText(p: { phase: string; done: number; total: number }): string {
  return `${p.phase}: ${p.done} of ${p.total}`;
}
