"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ShortLinkCard, type ShortLinkView } from "@/components/links/ShortLinkCard";
import { apiSend } from "./api";

type Started = { code: string; link: string; path: string; shortLink: ShortLinkView | null };
type Simulated = { codes: string[]; minutes: { median: number; min: number; max: number }; movements: number };

/**
 * Pilots for the team (editor or owner): take the participant's session yourself, here or on a
 * phone through a short link and QR code, or fill the study with simulated participants to see the
 * results, the time per session and the archive before anyone real takes part.
 */
/** realParticipantsPossible: the study is approved, so simulated people would mix with real ones unless left out (the default then). */
export function PilotPanel({ studyId, realParticipantsPossible = false }: { studyId: number; realParticipantsPossible?: boolean }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  const [phone, setPhone] = useState<Started | null>(null);
  const [n, setN] = useState("6");
  const [spread, setSpread] = useState("15");
  const [include, setInclude] = useState(!realParticipantsPossible);
  const [simulated, setSimulated] = useState<Simulated | null>(null);
  const run = async (f: () => Promise<void>) => {
    setBusy(true);
    setMsg(null);
    try {
      await f();
    } catch (e) {
      setMsg({ ok: false, text: e instanceof Error ? e.message : String(e) });
    } finally {
      setBusy(false);
    }
  };
  const start = (device: "here" | "phone") => run(async () => {
    const { pilot } = await apiSend<{ pilot: Started }>("POST", `/api/studies/${studyId}/pilots`, { device });
    if (device === "here") window.location.assign(pilot.path);
    else {
      setPhone(pilot);
      router.refresh();
    }
  });
  const simulate = () => run(async () => {
    const { simulated } = await apiSend<{ simulated: Simulated }>("POST", `/api/studies/${studyId}/pilots/simulated`, { participants: Number(n), spread: Number(spread) / 100, include });
    setSimulated(simulated);
    router.refresh();
  });
  return (
    <section className="card space-y-3" aria-labelledby="pilot-heading">
      <h2 id="pilot-heading">Pilot the study</h2>
      <p className="max-w-prose text-sm">
        Take the participant&apos;s session yourself, as it stands now (a draft too). Pilots show a “pilot” banner, take no counterbalancing place and no place under the cap, and stay out of results and archives unless you include them on the{" "}
        <Link href={`/studies/${studyId}/participants`}>Participants</Link> page, where you can also delete them. The usual cautions apply to you too: turning the device can strain the wrist, and turning views can cause motion sickness.
      </p>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn" disabled={busy} onClick={() => void start("here")}>Pilot on this device</button>
        <button type="button" className="btn-secondary" disabled={busy} onClick={() => void start("phone")}>Pilot on a phone</button>
      </div>
      {phone?.shortLink && <ShortLinkCard link={phone.shortLink} title={`Pilot ${phone.code} on a phone`} note="The link opens the pilot session; it stops working after an hour (the session itself stays on the phone)." />}
      <fieldset className="space-y-2 border-t border-slate-200 pt-3">
        <legend className="font-semibold">Simulated pilot</legend>
        <p className="max-w-prose text-sm">Simulated participants run every sequence of the design through each condition&apos;s settings (the project&apos;s simulated participant), each person a little faster or slower and more or less precise than the next, by the spread you choose.</p>
        <div className="flex flex-wrap items-end gap-3">
          <div><label htmlFor="sim-n">Simulated participants</label><input id="sim-n" className="input w-24" inputMode="numeric" value={n} onChange={(e) => setN(e.target.value)} /></div>
          <div><label htmlFor="sim-spread">Spread between people (%)</label><input id="sim-spread" className="input w-24" inputMode="numeric" value={spread} onChange={(e) => setSpread(e.target.value)} /></div>
          <label className="flex items-center gap-2"><input type="checkbox" checked={include} onChange={(e) => setInclude(e.target.checked)} /> Show them in results and archives</label>
          {realParticipantsPossible && <p className="w-full text-xs text-slate-600" data-testid="simulated-left-out">Left out by default: this study is approved, and simulated people shown in the results would mix with real participants&apos; data. You can include or leave them out later on the Participants page.</p>}
          <button type="button" className="btn-secondary" disabled={busy} onClick={() => void simulate()}>{busy ? "Simulating…" : "Run the simulated pilot"}</button>
        </div>
        {simulated && (
          <p className="notice" role="status" data-testid="simulated-summary">
            {simulated.codes.length} simulated participants ran {simulated.movements} measured movements. Time per session: median {simulated.minutes.median} min (from {simulated.minutes.min} to {simulated.minutes.max}).{" "}
            <Link href={`/studies/${studyId}/results`}>See the results</Link>.
          </p>
        )}
      </fieldset>
      {msg && <p className={msg.ok ? "notice" : "field-error"} role={msg.ok ? "status" : "alert"}>{msg.text}</p>}
    </section>
  );
}
