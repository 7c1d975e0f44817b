"use client";
import { useState } from "react";
import type { Technique } from "@/lib/motion/config";
import type { MotionSample } from "@/lib/motion/sample";
import { sampleRateReport } from "@/lib/motion/calibration/sampleRateReport";
import { estimateBiasAtRest } from "@/lib/motion/calibration/biasAtRest";
import { deviceVerdict, type DeviceInputs } from "@/lib/runner/deviceCheck";
import { ID1_CARD_HEIGHT_MM, ID1_CARD_WIDTH_MM, pixelsPerMmFromCard, viewingDistanceFromBlindSpot } from "@/lib/runner/calibration";
import type { CalibrationRequest, DeviceRequest } from "@/lib/runner/requests";
import type { InputProvider } from "./inputs";

const needsMotion = (t: Technique): boolean => t === "motion" || t === "motion+stick" || t === "motion+touch" || t === "tilt-rate";

/** Collects samples from a provider for `ms` milliseconds. */
async function collect(provider: InputProvider, ms: number): Promise<MotionSample[]> {
  const got: MotionSample[] = [];
  await provider.start((s) => got.push(s));
  await new Promise((r) => setTimeout(r, ms));
  provider.stop();
  return got;
}

export function DeviceStep(props: { techniques: Technique[]; minRateHz: number; provider: () => Promise<InputProvider>; screenedReturn?: string | null; onDone: (r: DeviceRequest) => Promise<void> }) {
  const [state, setState] = useState<"idle" | "measuring" | "refused">("idle");
  const [message, setMessage] = useState<string | null>(null);
  const motion = props.techniques.some(needsMotion);
  const check = async (): Promise<void> => {
    setState("measuring");
    setMessage(null);
    const inputs: DeviceInputs = {
      motion: false,
      gamepad: typeof navigator.getGamepads === "function" && Array.from(navigator.getGamepads()).some((g) => g !== null),
      touch: navigator.maxTouchPoints > 0,
      finePointer: window.matchMedia("(pointer: fine)").matches,
      sampleRateHz: null,
    };
    let jitter: number | null = null, kind: DeviceRequest["sourceKind"] = "none";
    if (motion) {
      try {
        const provider = await props.provider();
        kind = provider.kind === "none" ? "none" : provider.kind;
        const samples = await collect(provider, 2000);
        if (samples.length >= 3) {
          const r = sampleRateReport(samples.map((s) => s.tMs));
          inputs.motion = true;
          inputs.sampleRateHz = Math.round(r.meanRateHz * 10) / 10;
          jitter = Math.round(r.jitterSdMs * 1000) / 1000;
        }
      } catch (e) {
        setMessage(e instanceof Error && /permission/.test(e.message) ? "Motion sensors were not allowed. Allow them when your browser asks, then check again." : null);
      }
    }
    const verdict = deviceVerdict(props.techniques, inputs, props.minRateHz);
    await props.onDone({ inputs: { motion: inputs.motion, gamepad: inputs.gamepad, touch: inputs.touch, finePointer: inputs.finePointer }, sampleRateHz: inputs.sampleRateHz, jitterSdMs: jitter, sourceKind: kind, verdict: verdict.ok ? "ok" : "refused" });
    if (!verdict.ok) {
      setState("refused");
      setMessage(verdict.message);
    }
  };
  return (
    <section className="space-y-3">
      <h1 className="text-xl font-semibold">Device check</h1>
      <p>We check which inputs this device has{motion ? " and how often its motion sensors report" : ""}. {motion ? "Your browser may ask to allow motion sensors: please allow them." : ""}</p>
      {message && <p className="notice" role="alert">{message}</p>}
      <button type="button" className="btn w-full sm:w-auto" disabled={state === "measuring"} onClick={() => void check()}>
        {state === "measuring" ? "Checking… hold the device still" : state === "refused" ? "Check again" : "Check my device"}
      </button>
      {state === "refused" && props.screenedReturn && (
        <p>If this device cannot take part, you can <a href={props.screenedReturn} data-testid="screened-return">return to the recruitment site</a>; thank you for your time.</p>
      )}
    </section>
  );
}

export function CalibrationStep(props: { motion: boolean; needsDistance: boolean; provider: () => Promise<InputProvider>; onSave: (r: CalibrationRequest) => Promise<void>; onDone: () => void }) {
  const [part, setPart] = useState<"bias" | "card" | "blind">(props.motion ? "bias" : "card");
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [cardPx, setCardPx] = useState(324);
  const [pxPerMm, setPxPerMm] = useState<number | null>(null);
  const [blind, setBlind] = useState<number[]>([]);
  const [dotPx, setDotPx] = useState<number | null>(null);

  const measureBias = async (): Promise<void> => {
    setBusy(true);
    setMessage(null);
    try {
      const samples = await collect(await props.provider(), 2500);
      const b = estimateBiasAtRest(samples);
      await props.onSave({ kind: "bias", biasXDegPerS: b.biasXDegPerS, biasYDegPerS: b.biasYDegPerS, biasZDegPerS: b.biasZDegPerS, noiseSdDegPerS: Math.max(b.noiseSdXDegPerS, b.noiseSdYDegPerS, b.noiseSdZDegPerS), samples: b.n });
      setPart("card");
    } catch {
      setMessage("The device moved during the measurement. Put it down on a table (or hold it very still) and try again.");
    } finally {
      setBusy(false);
    }
  };
  const saveCard = async (): Promise<void> => {
    setBusy(true);
    const scale = pixelsPerMmFromCard(cardPx);
    await props.onSave({ kind: "card", cardWidthPx: cardPx, pixelsPerMm: scale });
    setPxPerMm(scale);
    setBusy(false);
    if (props.needsDistance) setPart("blind");
    else props.onDone();
  };
  const runBlind = (): void => {
    // the dot starts beside the fixation square and moves left; the participant presses when it vanishes
    const started = performance.now();
    const speedPxPerS = 60;
    const id = setInterval(() => setDotPx(20 + ((performance.now() - started) / 1000) * speedPxPerS), 30);
    const stop = async (): Promise<void> => {
      clearInterval(id);
      window.removeEventListener("keydown", onKey);
      const d = 20 + ((performance.now() - started) / 1000) * speedPxPerS;
      setDotPx(null);
      const all = [...blind, d];
      setBlind(all);
      if (all.length >= 5 && pxPerMm) {
        await props.onSave({ kind: "blind_spot", distancesPx: all, viewingDistanceMm: viewingDistanceFromBlindSpot(all, pxPerMm) });
        props.onDone();
      }
    };
    const onKey = (e: KeyboardEvent): void => {
      if (e.key === " ") {
        e.preventDefault();
        void stop();
      }
    };
    window.addEventListener("keydown", onKey);
  };

  return (
    <section className="space-y-3">
      <h1 className="text-xl font-semibold">Calibration</h1>
      {message && <p className="notice" role="alert">{message}</p>}
      {part === "bias" && (
        <>
          <h2 className="font-semibold">1. Sensor at rest</h2>
          <p>Put the device (or controller) down on a table and do not touch it for 3 seconds. This measures the small offset every motion sensor has.</p>
          <button type="button" className="btn w-full sm:w-auto" disabled={busy} onClick={() => void measureBias()}>{busy ? "Measuring… keep still" : "Measure"}</button>
        </>
      )}
      {part === "card" && (
        <>
          <h2 className="font-semibold">{props.motion ? "2." : "1."} Screen size</h2>
          <p>Hold a bank card, an ID card or a similar card of the standard size against the screen and change the size of the picture until it matches the card exactly.</p>
          <div aria-hidden className="rounded-lg border-2 border-slate-700 bg-slate-200" style={{ width: cardPx, height: (cardPx * ID1_CARD_HEIGHT_MM) / ID1_CARD_WIDTH_MM }} />
          <label className="block">Card size
            <input type="range" min={150} max={700} step={1} value={cardPx} onChange={(e) => setCardPx(Number(e.target.value))} className="w-full" aria-label="Card size in pixels" />
          </label>
          <button type="button" className="btn w-full sm:w-auto" disabled={busy} onClick={() => void saveCard()}>The picture matches the card</button>
        </>
      )}
      {part === "blind" && (
        <>
          <h2 className="font-semibold">3. Viewing distance</h2>
          <p>Sit as you will during the task. Close your left eye and look at the black square with your right eye. A red dot moves away; press Space the moment it disappears. ({blind.length} of 5)</p>
          <div className="relative h-24 w-full overflow-hidden">
            <div className="absolute right-4 top-8 h-6 w-6 bg-black" />
            {dotPx !== null && <div className="absolute top-9 h-4 w-4 rounded-full bg-red-600" style={{ right: 16 + 12 + dotPx }} />}
          </div>
          <button type="button" className="btn w-full sm:w-auto" disabled={dotPx !== null} onClick={runBlind}>Start</button>
        </>
      )}
    </section>
  );
}
