/// <reference lib="webworker" />
// The design page's slow checks, off the main thread: expected minutes and the power curve.
import { expectedSessionTime } from "@/lib/study/checks/sessionTime";
import { conditionNoise, powerModelFor, simulatePower } from "@/lib/study/power";
import type { ChecksAnswer, ChecksRequest } from "./checksProtocol";

const post = (a: ChecksAnswer) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(a);

self.onmessage = (e: MessageEvent<ChecksRequest>) => {
  const r = e.data;
  try {
    if (r.kind === "time") {
      const result = expectedSessionTime(r.design, (done, total) => post({ id: r.id, kind: "progress", phase: "simulating each condition", done, total }));
      post({ id: r.id, kind: "time", result });
    } else {
      const noise = conditionNoise(r.design, r.people, r.seed, (done, total) => post({ id: r.id, kind: "progress", phase: "simulated participants at each condition's settings", done, total }));
      const model = powerModelFor(r.design, r.request, noise);
      const points = simulatePower(model, r.nValues, r.studies, r.seed, (done, total) => post({ id: r.id, kind: "progress", phase: "simulated studies, each analysed", done, total }));
      post({ id: r.id, kind: "power", noise, points });
    }
  } catch (err) {
    post({ id: r.id, kind: "error", message: err instanceof Error ? err.message : String(err) });
  }
};
