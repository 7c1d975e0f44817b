"use client";
import { useEffect, useRef, useState } from "react";
import type { Technique } from "@/lib/motion/config";
import { sampleRateReport } from "@/lib/motion/calibration/sampleRateReport";
import { estimateBiasAtRest } from "@/lib/motion/calibration/biasAtRest";
import type { MotionSample } from "@/lib/motion/sample";
import { deviceVerdict, type DeviceInputs } from "@/lib/runner/deviceCheck";
import { inputPathsFor, usesMotion } from "@/lib/runner/inputPaths";
import { ID1_CARD_HEIGHT_MM, ID1_CARD_WIDTH_MM, pixelsPerMmFromCard, viewingDistanceFromBlindSpot } from "@/lib/runner/calibration";
import { motionPermissionHelp, sensorBrowser } from "@/lib/runner/permissionHelp";
import type { InputApi } from "@/lib/runner/batch";
import type { CalibrationRequest, DeviceRequest } from "@/lib/runner/requests";
import { askMotionPermission } from "./motionPermission";
import { controllerReportRate, recordMotion } from "./measure";

const round1 = (x: number): number => Math.round(x * 10) / 10;
const round3 = (x: number): number => Math.round(x * 1000) / 1000;

/** The help shown after the participant refused the motion sensors. */
export function PermissionHelp() {
  const steps = motionPermissionHelp(sensorBrowser(navigator.userAgent, navigator.maxTouchPoints));
  return (
    <div className="notice space-y-1" role="alert" data-testid="permission-help">
      <p className="font-semibold">Motion sensors are not allowed in this browser.</p>
      <p>This study needs them. To allow them again:</p>
      <ol className="list-decimal pl-5">{steps.map((s) => <li key={s}>{s}</li>)}</ol>
    </div>
  );
}

/** What the still part of the device check found, kept while the participant tilts the device. */
interface StillCheck {
  request: DeviceRequest;
  held: MotionSample[];
  /** The check's verdict on inputs and rate (before the gravity sign). */
  verdict: ReturnType<typeof deviceVerdict>;
}

/**
 * The device check: which inputs this device has for the study's techniques, through which
 * browser paths, how often they report and how old their input is when drawn. Where a
 * condition takes "up" from the accelerometer (`gravity`: the gravity and adaptive frames,
 * tilt-rate), a second part checks its sign: the readings while the device lies flat, screen
 * up, and while the participant tilts it (checkGravitySign). An inverted source is recorded and
 * turned round; one that cannot be told apart is refused with a plain message.
 */
export function DeviceStep(props: { techniques: Technique[]; displayMode: "cursor" | "view"; minRateHz: number; gravity: boolean; screenedReturn?: string | null; onDone: (r: DeviceRequest) => Promise<void> }) {
  const [state, setState] = useState<"idle" | "measuring" | "tilt" | "tilting" | "refused" | "denied">("idle");
  const [message, setMessage] = useState<string | null>(null);
  const still = useRef<StillCheck | null>(null);
  const motion = props.techniques.some(usesMotion);
  const controller = props.techniques.some((t) => inputPathsFor(t, props.displayMode).gamepad === "required");
  const finish = async (request: DeviceRequest, refusal: string | null): Promise<void> => {
    await props.onDone(request);
    if (refusal !== null) {
      setState("refused");
      setMessage(refusal);
    } else setState("idle");
  };
  const check = async (): Promise<void> => {
    // first, inside the tap: iOS asks for the motion sensors only from a user gesture
    const permission = motion ? await askMotionPermission() : "granted";
    if (permission === "denied") {
      setState("denied");
      return;
    }
    setState("measuring");
    setMessage(null);
    const inputs: DeviceInputs = {
      motion: false,
      gamepad: false,
      touch: navigator.maxTouchPoints > 0,
      finePointer: window.matchMedia("(pointer: fine)").matches,
      sampleRateHz: null,
    };
    const apis: InputApi[] = [];
    let jitter: number | null = null, kind: DeviceRequest["sourceKind"] = "none", requestedRateHz: number | null = null;
    let ageMedian: number | null = null, ageP95: number | null = null, controllerRateHz: number | null = null;
    const [recording, pads] = await Promise.all([
      motion ? recordMotion(2000).catch(() => null) : Promise.resolve(null),
      controller ? controllerReportRate(2000) : Promise.resolve(null),
    ]);
    if (recording) {
      kind = recording.api;
      apis.push(recording.api);
      requestedRateHz = recording.requestedRateHz;
      if (recording.samples.length >= 3) {
        const r = sampleRateReport(recording.samples.map((s) => s.tMs));
        inputs.motion = true;
        inputs.sampleRateHz = round1(r.meanRateHz);
        jitter = round3(r.jitterSdMs);
      }
      if (recording.age) {
        ageMedian = round3(recording.age.medianMs);
        ageP95 = round3(recording.age.p95Ms);
      }
    }
    if (pads !== null) {
      inputs.gamepad = true;
      controllerRateHz = pads;
      apis.push("gamepad");
      if (kind === "none") kind = "gamepad";
    } else {
      const { gamepadConnected } = await import("@/lib/motion/sources/gamepad");
      inputs.gamepad = gamepadConnected(window);
    }
    const verdict = deviceVerdict(props.techniques, inputs, props.minRateHz);
    const request: DeviceRequest = {
      inputs: { motion: inputs.motion, gamepad: inputs.gamepad, touch: inputs.touch, finePointer: inputs.finePointer },
      sampleRateHz: inputs.sampleRateHz, jitterSdMs: jitter, sourceKind: kind, verdict: verdict.ok ? "ok" : "refused",
      inputApis: apis, requestedRateHz, controllerRateHz, inputAgeMedianMs: ageMedian, inputAgeP95Ms: ageP95, gravitySign: null,
    };
    if (verdict.ok && props.gravity && recording) {
      // the sign of "up" next: these readings are the device lying flat, screen up
      still.current = { request, held: recording.samples, verdict };
      setState("tilt");
      return;
    }
    await finish(request, verdict.ok ? null : verdict.message);
  };
  const tilt = async (): Promise<void> => {
    const first = still.current;
    if (!first) return setState("idle");
    setState("tilting");
    setMessage(null);
    const recording = await recordMotion(TILT_MS).catch(() => null);
    // loaded only by studies that need it (the participant route stays small)
    const { checkGravitySign } = await import("@/lib/motion/calibration/gravitySignCheck");
    const result = checkGravitySign({ posture: "flat", held: first.held, tilting: recording?.samples ?? [] });
    if (result.verdict === "fine" || result.verdict === "inverted") {
      still.current = null;
      return finish({ ...first.request, gravitySign: result.verdict === "fine" ? "normal" : "inverted" }, null);
    }
    if (result.retry) {
      setMessage(result.message);
      // the flat part again when that was unclear; else only the tilting
      if (result.posture.verdict === "cannot-tell") {
        still.current = null;
        setState("idle");
      } else setState("tilt");
      return;
    }
    // a mirrored axis: "up" from this device cannot be trusted, and trying again will not change that
    still.current = null;
    await finish({ ...first.request, verdict: "refused", gravitySign: "mirrored" }, result.message);
  };
  return (
    <section className="space-y-3">
      <h1 className="text-xl font-semibold">Device check</h1>
      <p>
        We check which inputs this device has{motion ? " and how often its motion sensors report" : ""}{controller ? " and whether your controller is connected" : ""}.
        {motion && " Your browser may ask to allow motion sensors: please allow them."}
      </p>
      {state === "tilt" || state === "tilting" ? (
        <>
          <h2 className="font-semibold">Part 2 of 2: which way is up</h2>
          <p>Pick the device up and hold it in front of you. After you tap the button, tilt it slowly forward and back a few times, then side to side a few times, for {TILT_MS / 1000} seconds. Small, gentle movements are enough.</p>
        </>
      ) : (
        <>
          {motion && <p>{props.gravity ? "Part 1 of 2: put" : "Put"} the device flat on a table, screen up, then tap the button and do not touch the device for 2 seconds.</p>}
          {controller && <p>Connect your controller and press any of its buttons once, so the browser can see it.</p>}
        </>
      )}
      {state === "denied" && <PermissionHelp />}
      {message && <p className="notice" role="alert">{message}</p>}
      {state === "refused" && props.screenedReturn && (
        <p>If this device cannot take part, you can <a href={props.screenedReturn} data-testid="screened-return">return to the recruitment site</a>; thank you for your time.</p>
      )}
      {state === "tilt" || state === "tilting" ? (
        <button type="button" className="btn w-full sm:w-auto" disabled={state === "tilting"} onClick={() => void tilt()}>
          {state === "tilting" ? "Tilting… forward and back, then side to side" : "Start tilting"}
        </button>
      ) : (
        <button type="button" className="btn w-full sm:w-auto" disabled={state === "measuring"} onClick={() => void check()}>
          {state === "measuring" ? "Checking… keep the device still" : state === "idle" && !message ? "Check my device" : "Check again"}
        </button>
      )}
    </section>
  );
}

/** How long the participant tilts the device for the gravity-sign check (ms). */
const TILT_MS = 5000;

/** Which calibration parts a study needs: bias for motion sensors, the card for mm and visual degrees, the blind spot for visual degrees. */
export function calibrationParts(motion: boolean, unit: "px" | "mm" | "deg-visual" | "deg-view"): Array<"bias" | "card" | "blind"> {
  const parts: Array<"bias" | "card" | "blind"> = [];
  if (motion) parts.push("bias");
  if (unit === "mm" || unit === "deg-visual") parts.push("card");
  if (unit === "deg-visual") parts.push("blind");
  return parts;
}

/** Speed of the blind-spot dot, CSS px per second. */
const BLIND_DOT_PX_PER_S = 60;

export function CalibrationStep(props: { motion: boolean; unit: "px" | "mm" | "deg-visual" | "deg-view"; onSave: (r: CalibrationRequest) => Promise<void>; onDone: () => void }) {
  const parts = calibrationParts(props.motion, props.unit);
  const [index, setIndex] = useState(0);
  const part = parts[index];
  const [busy, setBusy] = useState(false);
  const [denied, setDenied] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [cardPx, setCardPx] = useState(324);
  const [pxPerMm, setPxPerMm] = useState<number | null>(null);
  const [blind, setBlind] = useState<number[]>([]);
  const [dotPx, setDotPx] = useState<number | null>(null);
  const stopRef = useRef<(() => void) | null>(null);
  const areaRef = useRef<HTMLDivElement>(null);
  const onDone = props.onDone;
  const nextPart = (): void => {
    if (index + 1 < parts.length) setIndex(index + 1);
    else onDone();
  };
  useEffect(() => {
    if (parts.length === 0) onDone(); // nothing to calibrate for this study
  }, [parts.length, onDone]);

  const measureBias = async (): Promise<void> => {
    if ((await askMotionPermission()) === "denied") return setDenied(true);
    setBusy(true);
    setMessage(null);
    try {
      const { samples } = await recordMotion(2500);
      const b = estimateBiasAtRest(samples);
      await props.onSave({ kind: "bias", biasXDegPerS: b.biasXDegPerS, biasYDegPerS: b.biasYDegPerS, biasZDegPerS: b.biasZDegPerS, noiseSdDegPerS: Math.max(b.noiseSdXDegPerS, b.noiseSdYDegPerS, b.noiseSdZDegPerS), samples: b.n });
      nextPart();
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
    nextPart();
  };
  const runBlind = (): void => {
    // the dot starts beside the fixation square and moves left, into the left eye's blind spot
    const started = performance.now();
    setMessage(null);
    const id = setInterval(() => {
      const d = 20 + ((performance.now() - started) / 1000) * BLIND_DOT_PX_PER_S;
      // the dot would leave the grey area before it vanished: a disappearance there is the edge, not the blind spot
      if (16 + 12 + d + 16 > (areaRef.current?.clientWidth ?? Infinity)) {
        end();
        setDotPx(null);
        setMessage("The dot reached the edge of the screen before it disappeared. Hold the screen a little closer (or turn the device sideways) and start again.");
        return;
      }
      setDotPx(d);
    }, 30);
    const end = (): void => {
      clearInterval(id);
      stopRef.current = null;
      window.removeEventListener("keydown", onKey);
    };
    const stop = async (): Promise<void> => {
      end();
      const d = 20 + ((performance.now() - started) / 1000) * BLIND_DOT_PX_PER_S;
      setDotPx(null);
      const all = [...blind, d];
      setBlind(all);
      if (all.length >= 5 && pxPerMm) {
        await props.onSave({ kind: "blind_spot", distancesPx: all, viewingDistanceMm: viewingDistanceFromBlindSpot(all, pxPerMm) });
        nextPart();
      }
    };
    const onKey = (e: KeyboardEvent): void => {
      if (e.key === " ") {
        e.preventDefault();
        void stop();
      }
    };
    stopRef.current = () => void stop();
    window.addEventListener("keydown", onKey);
  };
  useEffect(() => () => stopRef.current?.(), []);

  if (!part) return null;
  const number = `${index + 1}.`;
  return (
    <section className="space-y-3">
      <h1 className="text-xl font-semibold">Calibration</h1>
      {message && <p className="notice" role="alert">{message}</p>}
      {part === "bias" && (
        <>
          <h2 className="font-semibold">{number} Sensor at rest</h2>
          <p>Put the device (or controller) down on a table and do not touch it for 3 seconds. This measures the small offset every motion sensor has.</p>
          {denied && <PermissionHelp />}
          <button type="button" className="btn w-full sm:w-auto" disabled={busy} onClick={() => void measureBias()}>{busy ? "Measuring… keep still" : "Measure"}</button>
        </>
      )}
      {part === "card" && (
        <>
          <h2 className="font-semibold">{number} Screen size</h2>
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
          <h2 className="font-semibold">{number} Viewing distance</h2>
          <p>Sit as you will during the task. Close your <strong>right</strong> eye and look at the black square with your <strong>left</strong> eye. A red dot moves to the left, away from the square; the moment it disappears, tap the grey area (or press Space). ({blind.length} of 5)</p>
          <div ref={areaRef} className="relative h-24 w-full touch-none overflow-hidden rounded bg-slate-100" data-testid="blind-spot-area"
            onPointerDown={() => stopRef.current?.()}>
            <div className="absolute right-4 top-8 h-6 w-6 bg-black" data-testid="blind-spot-square" />
            {dotPx !== null && <div className="absolute top-9 h-4 w-4 rounded-full bg-red-600" data-testid="blind-spot-dot" style={{ right: 16 + 12 + dotPx }} />}
          </div>
          <button type="button" className="btn w-full sm:w-auto" disabled={dotPx !== null} onClick={runBlind}>Start</button>
        </>
      )}
    </section>
  );
}
