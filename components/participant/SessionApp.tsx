"use client";
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import type { StudyDesign } from "@/lib/study/design";
import type { TransferConfig } from "@/lib/motion/config";
import { planSequences } from "@/lib/runner/planCore";
import { uploadKey } from "@/lib/runner/uploadKey";
import { STAGES, advanceProgress, currentStep, initialProgress, progressFraction, type Progress } from "@/lib/runner/progress";
import { trialUnit } from "@/lib/runner/calibration";
import { selectButtonFor } from "@/lib/runner/selectButton";
import type { SequenceBatch } from "@/lib/runner/batch";
import type { CalibrationRequest, DeviceRequest, SessionState } from "@/lib/runner/requests";
import { errorMessage, postSession } from "./api";
import { openSessionStore, type SessionStore } from "./store";
import { createUploader, type Uploader, type UploadStatus } from "./uploader";
import { usesMotion } from "@/lib/runner/inputPaths";
import { gravityCheckNeeded } from "@/lib/motion/calibration/gravityCheckNeeded";
import { controlHelp, type ControlContext } from "@/lib/runner/controls";
import { TaskCanvas, type FinishedSequence, type TaskSetup } from "./TaskCanvas";
import { BreakStep, ConditionQuestionnaire, ConsentStep, FinalQuestionnaire, InfoStep, InstructionsStep, type TechniqueControls } from "./Steps";
import { CalibrationStep, DeviceStep, PermissionHelp } from "./Checks";
import { askMotionPermission } from "./motionPermission";
import { enterTaskScreen, leaveTaskScreen, useWakeLock } from "./screen";

const rank = (p: Progress): number => STAGES.indexOf(p.stage) * 100_000 + p.done;

function base64(bytes: Uint8Array): string {
  let s = "";
  for (let i = 0; i < bytes.length; i += 0x8000) s += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(s);
}

/** The participant's whole session: every step, resumable, with the local store and the upload queue. */
export function SessionApp({ token, initial }: { token: string; initial: SessionState }) {
  const [st, setSt] = useState(initial);
  const design = st.design as StudyDesign;
  const [progress, setProgress] = useState<Progress>((initial.progress as Progress) ?? initialProgress());
  const [ready, setReady] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [upload, setUpload] = useState<UploadStatus>({ pending: 0, refused: 0, sending: false, waiting: false, stopped: false });
  const [withdrawing, setWithdrawing] = useState(false);
  const [withdrawn, setWithdrawn] = useState(initial.status === "withdrawn");
  const [code, setCode] = useState<string | null>(initial.completionCode);
  const [returnUrl, setReturnUrl] = useState<string | null>(initial.returnTo?.complete ?? null);
  const [full, setFull] = useState(false);
  const [calibration, setCalibration] = useState(initial.calibration);
  const [retry, setRetry] = useState(0);
  // the upload queue's first report (until then its counts are not known)
  const [uploadSeen, setUploadSeen] = useState(false);
  const storeRef = useRef<SessionStore | null>(null);
  const uploaderRef = useRef<Uploader | null>(null);
  // after a reload or in a new tab, the task waits for a tap: motion permission (iOS) and fullscreen need a user gesture
  const [gate, setGate] = useState<"closed" | "open" | "denied">("open");
  const [ctx, setCtx] = useState<ControlContext>({ touchScreen: false, keyboard: true, controller: false });

  // merged and validated on the server, so this page carries no schema code
  const configs = st.configs;
  const techniques = useMemo(() => [...new Set(configs.map((c) => c.technique))], [configs]);
  const motion = techniques.some(usesMotion);
  // a condition takes "up" from the accelerometer: the device check tests its sign
  const gravity = useMemo(() => configs.some(gravityCheckNeeded), [configs]);
  const plan = useMemo(() => (st.order && st.planSeed !== null ? planSequences(design, st.conditions, st.order, st.planSeed) : []), [design, st.conditions, st.order, st.planSeed]);
  useWakeLock(progress.stage === "task" && !withdrawn);

  // open the local store, resume from whichever progress is further, start the upload queue
  useEffect(() => {
    if (withdrawn || st.status === "completed") {
      setReady(true);
      return;
    }
    let cancelled = false;
    void (async () => {
      const store = await openSessionStore(st.participantId);
      if (cancelled) return;
      storeRef.current = store;
      const local = await store.progress();
      const resumed = local && rank(local) > rank(progress) ? local : progress;
      if (resumed !== progress) setProgress(resumed);
      if (resumed.stage === "task") setGate("closed");
      uploaderRef.current = createUploader(token, store, (u) => {
        setUpload(u);
        setUploadSeen(true);
      });
      uploaderRef.current.kick();
      const pads = typeof navigator.getGamepads === "function" ? Array.from(navigator.getGamepads()) : [];
      setCtx({ touchScreen: navigator.maxTouchPoints > 0, keyboard: window.matchMedia("(pointer: fine)").matches, controller: pads.some((p) => p !== null) });
      setReady(true);
    })();
    return () => {
      cancelled = true;
      uploaderRef.current?.stop();
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  const persist = useCallback((p: Progress): void => {
    setProgress(p);
    void storeRef.current?.saveProgress(p);
    if (p.stage !== "info" && p.stage !== "consent") void postSession(token, "progress", p).catch(() => undefined);
  }, [token]);

  const next = useCallback((): void => persist(advanceProgress(progress, plan, design)), [persist, progress, plan, design]);

  const refresh = async (): Promise<SessionState> => {
    const res = await fetch(`/api/session/${encodeURIComponent(token)}`, { cache: "no-store", credentials: "omit" });
    const s = (await res.json()) as SessionState;
    setSt(s);
    return s;
  };

  const send = async (path: string, body: unknown): Promise<boolean> => {
    setBusy(true);
    setError(null);
    try {
      const res = await postSession(token, path, body);
      if (res.status === 410) {
        setWithdrawn(true);
        return false;
      }
      if (!res.ok) {
        if (res.status === 409) setFull(((await res.clone().json().catch(() => null)) as { error?: { code?: string } } | null)?.error?.code === "full");
        setError(await errorMessage(res));
        return false;
      }
      return true;
    } catch {
      setError("The server cannot be reached. Check your connection and try again.");
      return false;
    } finally {
      setBusy(false);
    }
  };

  const step = currentStep(progress, plan, design);
  // each condition's controls, told once per distinct set (a study may mix techniques and activations)
  const techniqueControls = useMemo<TechniqueControls[]>(() => {
    const cards = new Map<string, TechniqueControls>();
    configs.forEach((c, i) => {
      const help = controlHelp(c.technique, c, design.task.selection, selectButtonFor(c), design.task.dwellMs, design.task.displayMode, ctx);
      const key = `${c.technique}:${JSON.stringify(help)}`;
      const card = cards.get(key) ?? { technique: c.technique, help, conditions: [] };
      card.conditions.push(st.conditions[i] ?? "");
      cards.set(key, card);
    });
    return [...cards.values()];
  }, [configs, design.task, ctx, st.conditions]);
  useEffect(() => {
    if (progress.stage === "final" || progress.stage === "complete") leaveTaskScreen();
  }, [progress.stage]);
  const openGate = async (): Promise<void> => {
    // permission first, inside the tap (iOS asks only from a gesture); then fullscreen
    if (motion && (await askMotionPermission()) === "denied") return setGate("denied");
    void enterTaskScreen();
    setGate("open");
  };
  const item = step.kind === "sequence" ? plan[step.index] : undefined;
  const setup = useMemo<TaskSetup | null>(() => {
    if (!item) return null;
    const base = configs[item.conditionIndex]!;
    const b = calibration.bias;
    // the participant's calibration joins the condition's configuration (a replay of the stream takes the same)
    const config: TransferConfig = {
      ...base,
      ...(b ? { biasXDegPerS: b.x, biasYDegPerS: b.y, biasZDegPerS: b.z } : {}),
      ...(calibration.accelerometerInverted ? { accelerometerInverted: true } : {}),
    };
    return {
      type: design.task.type, displayMode: design.task.displayMode, unit: design.task.unit, targetsPerRing: design.task.targetsPerRing,
      amplitude: item.amplitude, width: item.width, selection: design.task.selection, dwellMs: design.task.dwellMs, timeLimitMs: design.task.trialTimeLimitMs,
      config, selectButton: selectButtonFor(config), calibration: { pixelsPerMm: calibration.pixelsPerMm, viewingDistanceMm: calibration.viewingDistanceMm },
    };
    // a new setup object per sequence (index), not per render
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [step.kind === "sequence" ? step.index : -1, calibration]);

  const onFinished = useCallback(async (f: FinishedSequence): Promise<void> => {
    if (!item || step.kind !== "sequence") return;
    const batch: SequenceBatch = {
      key: uploadKey(st.participantId, item), practice: item.practice, block: item.block, conditionIndex: item.conditionIndex, condition: item.condition, sequence: item.sequence,
      unit: trialUnit(design.task.unit), amplitude: item.amplitude, width: item.width, movements: f.movements,
      stream: { gzipBase64: base64(f.streamGzip), sampleCount: f.samples.length }, quality: f.quality,
    };
    const p = advanceProgress(progress, plan, design);
    await storeRef.current?.finishSequence(batch, p);
    setProgress(p);
    uploaderRef.current?.kick();
    void postSession(token, "progress", p).catch(() => undefined);
  }, [item, step.kind, st.participantId, design, progress, plan, token]);

  // completion: wait until every sequence has left the browser, then ask for the code
  useEffect(() => {
    if (progress.stage !== "complete" || code || withdrawn || !uploadSeen || upload.pending > 0 || upload.refused > 0 || !ready) return;
    setError(null);
    void (async () => {
      const res = await postSession(token, "complete", {}).catch(() => null);
      if (res?.ok) {
        const done = (await res.json()) as { completionCode: string; returnUrl?: string | null };
        setCode(done.completionCode);
        setReturnUrl(done.returnUrl ?? null);
      }
      else if (res?.status === 409 && retry < 20) {
        // the server has not stored the last round yet (its upload may still be on the way): ask again shortly
        setTimeout(() => setRetry((n) => n + 1), 1500);
      }
      else if (res) setError(await errorMessage(res));
    })();
  }, [progress.stage, code, withdrawn, uploadSeen, upload.pending, upload.refused, ready, token, retry]);

  const withdraw = async (): Promise<void> => {
    uploaderRef.current?.stop();
    leaveTaskScreen();
    await storeRef.current?.clear();
    if (await send("withdraw", {})) setWithdrawn(true);
    setWithdrawing(false);
  };

  if (withdrawn) {
    return (
      <main className="mx-auto max-w-xl space-y-3 p-4">
        <h1 className="text-xl font-semibold">You have withdrawn</h1>
        <p>Thank you for your time. No further data is recorded from this session{design.eraseOnWithdrawal ? ", and what was recorded so far has been erased" : ""}.</p>
        <p className="text-sm">Your participant code: <span className="font-mono" data-testid="participant-code">{st.participantCode}</span></p>
      </main>
    );
  }
  if (!ready) return <main className="p-4"><p>Loading your session…</p><p className="text-sm">Your participant code: <span className="font-mono">{st.participantCode}</span></p></main>;

  const fraction = progressFraction(progress, plan);
  const measured = plan.filter((s) => !s.practice).length;
  const header = (
    <header className="flex flex-wrap items-center gap-2 border-b border-slate-300 px-3 py-2 text-sm">
      {st.pilot && <p role="note" data-testid="pilot-banner" className="w-full rounded bg-amber-200 px-2 py-1 font-semibold text-amber-950">Pilot run: the team trying the session. It takes no place and stays out of the results unless the team includes it.</p>}
      <span className="font-semibold">{st.study.title}</span>
      <span>Your code: <span className="font-mono" data-testid="participant-code">{st.participantCode}</span></span>
      <div className="flex min-w-[8rem] flex-1 items-center gap-2">
        <progress className="h-2 flex-1" max={1} value={fraction} aria-label="Progress" />
        <span data-testid="progress-text">{Math.round(fraction * 100)} % done</span>
      </div>
      <span data-testid="upload-status" aria-live="polite">
        {upload.refused > 0 ? `${upload.refused} round(s) refused by the server` : upload.pending > 0 ? (upload.waiting ? `${upload.pending} round(s) kept on this device, sending when the connection returns` : `sending ${upload.pending} round(s)…`) : "all data sent"}
      </span>
      <button type="button" className="btn-secondary" onClick={() => setWithdrawing(true)}>{progress.stage === "complete" ? "Withdraw" : "Stop and withdraw"}</button>
    </header>
  );
  const confirm = withdrawing && (
    <div role="dialog" aria-modal="true" aria-labelledby="withdraw-title" className="card m-3 space-y-2">
      <h2 id="withdraw-title" className="font-semibold">Stop and withdraw?</h2>
      <p>{progress.stage === "complete" ? "You have finished, and you may still withdraw." : "No further data will be recorded."} {design.eraseOnWithdrawal ? "What was recorded will be erased." : "What was recorded is kept, as the consent document explains."}</p>
      <div className="flex gap-2">
        <button type="button" className="btn" onClick={() => void withdraw()}>Withdraw</button>
        <button type="button" className="btn-secondary" onClick={() => setWithdrawing(false)}>Keep going</button>
      </div>
    </div>
  );

  let body: React.ReactNode;
  switch (step.kind) {
    case "info":
      body = <InfoStep title={st.study.title} summary={st.study.summary} compensation={st.study.compensation} viewMode={design.task.displayMode === "view"} techniques={techniques} onNext={next} />;
      break;
    case "consent":
      body = st.consent ? (
        <ConsentStep body={st.consent.body} requireName={design.requireTypedName} busy={busy} error={error} onSign={async (v) => {
          const ok = await send("consent", { consentVersionId: st.consent!.versionId, versionHash: st.consent!.hash, agreed: v.agreed, typedName: v.typedName, email: v.email, screenShortSidePx: Math.min(window.screen.width, window.screen.height) || null });
          if (ok) {
            await refresh();
            persist({ ...progress, stage: "device" });
          }
        }} />
      ) : <p className="notice">This study cannot take part yet: its consent document is not approved.</p>;
      if (full && st.returnTo?.screened) body = <>{body}<p><a className="btn inline-block" href={st.returnTo.screened} data-testid="screened-return">Return to the recruitment site</a></p></>;
      break;
    case "device":
      body = <DeviceStep techniques={techniques} displayMode={design.task.displayMode} minRateHz={design.minSampleRateHz} gravity={gravity} screenedReturn={st.returnTo?.screened ?? null} onDone={async (r: DeviceRequest) => {
        if (!(await send("device", r))) return;
        setCalibration((c) => ({ ...c, accelerometerInverted: r.gravitySign === "inverted" }));
        if (r.verdict === "ok") next();
      }} />;
      break;
    case "calibration":
      body = <CalibrationStep motion={motion} unit={design.task.unit}
        onSave={async (r: CalibrationRequest) => {
          if (!(await send("calibration", r))) throw new Error("not saved");
          if (r.kind === "bias") setCalibration((c) => ({ ...c, bias: { x: r.biasXDegPerS, y: r.biasYDegPerS, z: r.biasZDegPerS } }));
          if (r.kind === "card") setCalibration((c) => ({ ...c, pixelsPerMm: r.pixelsPerMm }));
          if (r.kind === "blind_spot") setCalibration((c) => ({ ...c, viewingDistanceMm: r.viewingDistanceMm }));
        }}
        onDone={next} />;
      break;
    case "instructions":
      // the first task sequence starts: take a counterbalancing place and its condition order
      body = <InstructionsStep displayMode={design.task.displayMode} controls={techniqueControls} practice={design.task.practiceSequences > 0} onNext={async () => {
        // first, inside the tap: after a reload on this page the sensors were never allowed in it (iOS asks
        // only from a gesture), then fullscreen (also from a gesture); a refusal shows its help before the task
        if (motion && (await askMotionPermission()) === "denied") setGate("denied");
        void enterTaskScreen();
        if (!(await send("start", {}))) return;
        await refresh();
        persist({ ...progress, stage: "task" });
      }} />;
      break;
    case "break":
      body = <BreakStep key={step.index} seconds={step.seconds} onNext={next} />;
      break;
    case "sequence": {
      const done = plan.slice(0, step.index).filter((s) => !s.practice).length;
      body = gate !== "open" ? (
        <section className="space-y-3" data-testid="resume-gate">
          <h1 className="text-xl font-semibold">Welcome back</h1>
          <p>Your session continues with {item?.practice ? "a practice round" : `round ${done + 1} of ${measured}`}. Everything you did so far is kept.</p>
          {gate === "denied" && <PermissionHelp />}
          <button type="button" className="btn w-full sm:w-auto" onClick={() => void openGate()}>Tap to continue</button>
        </section>
      ) : setup && item ? (
        <div className="flex h-full flex-col">
          <p className="px-3 py-1 text-sm" data-testid="round-label">{item.practice ? "Practice round (does not count)" : `Round ${done + 1} of ${measured}`}</p>
          <TaskCanvas key={step.index} setup={setup}
            onMovement={(m) => void storeRef.current?.saveMovement(uploadKey(st.participantId, item), m)}
            onFinished={(f) => void onFinished(f)} />
        </div>
      ) : null;
      break;
    }
    case "condition-questionnaire":
      body = <ConditionQuestionnaire key={step.condition} items={design.perConditionItems} busy={busy} onSubmit={async (answers) => {
        if (await send("questionnaire", { condition: step.condition, answers })) next();
      }} />;
      break;
    case "final":
      body = <FinalQuestionnaire ask={design.finalQuestionnaire} busy={busy} onSubmit={async (answers) => {
        if (await send("questionnaire", { condition: "", answers })) next();
      }} />;
      break;
    case "complete":
      body = code ? (
        <section className="space-y-3">
          <h1 className="text-xl font-semibold">Thank you: you have finished</h1>
          <p>Your completion code:</p>
          <p className="text-2xl font-mono font-semibold" data-testid="completion-code">{code}</p>
          <p>Copy it into the recruitment site if it asks for one.</p>
          {returnUrl && <p><a className="btn inline-block" href={returnUrl} data-testid="complete-return">Return to the recruitment site</a></p>}
        </section>
      ) : (
        upload.refused > 0 ? (
          <section className="space-y-3">
            <h1 className="text-xl font-semibold">Some of your rounds could not be stored</h1>
            <p>The server refused {upload.refused} round(s) from this device, so the session cannot be completed here. Please write to the research team (the contact is in the consent text) and say so; what you did is kept on this device.</p>
          </section>
        ) : (
          <section className="space-y-3">
            <h1 className="text-xl font-semibold">{upload.pending > 0 ? "Sending your last data…" : "Finishing…"}</h1>
            <p>Keep this page open. {upload.waiting ? "The connection is down; the data waits on this device and is sent when it returns." : ""}</p>
            {error && (
              <>
                <p className="field-error" role="alert">{error}</p>
                <button type="button" className="btn-secondary" onClick={() => setRetry((n) => n + 1)}>Try again</button>
              </>
            )}
          </section>
        )
      );
      break;
  }

  return (
    // the page may draw under a notch or the status bar (viewport-fit=cover): its edges keep to the safe area;
    // during a round it is exactly the visible height (dvh: without the browser's own bars), so the controls stay on screen
    <div className={step.kind === "sequence" ? "flex h-dvh flex-col" : "flex min-h-dvh flex-col"}
      style={{ paddingTop: "env(safe-area-inset-top)", paddingLeft: "env(safe-area-inset-left)", paddingRight: "env(safe-area-inset-right)" }}>
      {header}
      {confirm}
      <main className={step.kind === "sequence" ? "min-h-0 flex-1" : "mx-auto w-full max-w-xl flex-1 space-y-3 p-4"}>
        {step.kind !== "consent" && step.kind !== "sequence" && error && <p className="field-error" role="alert">{error}</p>}
        {body}
      </main>
    </div>
  );
}
