import type { Queryable } from "@/lib/db";
import { holdsPlace } from "@/lib/study/counterbalance";
import { conditionsOf, studyDesignSchema, type StudyDesign } from "@/lib/study/design";
import { openWithDataKey } from "@/lib/recruitment/dataKey";
import { progressSchema, qualityFlags } from "@/lib/runner";
import { inactivityMs } from "./places";
import { fetchStudyDesign } from "./results";
import { jsonColumn, type ParticipantRow } from "./participants";

/** One participant as the participants page lists them. */
export interface ParticipantListEntry {
  id: number;
  code: string;
  kind: ParticipantRow["kind"];
  included: boolean;
  source: ParticipantRow["source"];
  status: ParticipantRow["status"];
  /** Where the session is: information, consent, device check, …, "round k of n", complete. */
  stage: string;
  deviceVerdict: "ok" | "refused" | null;
  /** Device class, browser and operating system family, from the consent record's coarse summary. */
  deviceClass: string | null;
  browser: string | null;
  os: string | null;
  sensorSource: string | null;
  sampleRateHz: number | null;
  /** The completion code of a real participant who completed (null before: nobody has earned it yet). */
  completionCode: string | null;
  /** The team revoked the invitation before it was used. */
  revoked: boolean;
  protocolVersion: number | null;
  /** Counterbalancing row (1-based as shown) and what became of the place. */
  row: number | null;
  place: "holds" | "released: device check" | "released: withdrew" | "released: inactive" | "inactive (place free for the next)" | null;
  /** An active exclusion of the participant, or of some of their sequences. */
  exclusion: string | null;
  exclusionId: number | null;
  excludedSequences: number;
  /** Data-quality warnings that suggest an exclusion. */
  flags: string[];
  createdAt: Date;
  lastActivityAt: Date | null;
  /** The recruitment panel's participant id, for the owner only (matching payments). */
  panelId: string | null;
}

type Row = ParticipantRow & { version: number | null; device_summary: unknown };

const BEFORE_TASKS = new Set(["info", "consent", "device", "calibration", "instructions"]);
const STAGE_WORDS: Record<string, string> = { info: "information", consent: "consent", device: "device check", calibration: "calibration", instructions: "instructions", final: "final questions", complete: "complete" };

/**
 * Every participant of a study for its participants page (fetchParticipantList): status, stage,
 * device verdict, browser and OS class, sensor source and rate, completion code, protocol
 * version, place, exclusions and data-quality warnings. Pilots and simulated participants come
 * with their kind, so the page can show them apart. The panel id is decrypted for the owner only.
 */
export async function fetchParticipantList(q: Queryable, studyId: number, options: { isOwner: boolean; now?: Date }): Promise<ParticipantListEntry[]> {
  const now = options.now ?? new Date();
  const studyDesign = await fetchStudyDesign(q, studyId);
  const limit = await inactivityMs(q, studyId);
  const rows = await q("participants as p").leftJoin("study_reviews as v", "v.id", "p.protocol_version_id").leftJoin("consent_records as c", "c.participant_id", "p.id")
    .where("p.study_id", studyId).orderBy("p.id", "desc").select<Row[]>("p.*", "v.version as version", "c.device_summary as device_summary");
  if (rows.length === 0) return [];
  const ids = rows.map((r) => r.id);
  const [streams, errors, biases, exclusions] = await Promise.all([
    q("sequence_streams").whereIn("participant_id", ids).where({ practice: false }).groupBy("participant_id").select<{ participant_id: number; n: number }[]>("participant_id", q.raw("count(*) as n")),
    q("trials").whereIn("participant_id", ids).where({ practice: false }).groupBy("participant_id").select<{ participant_id: number; miss: number; n: number }[]>("participant_id", q.raw("sum(1 - hit) as miss"), q.raw("count(*) as n")),
    q("calibrations").whereIn("participant_id", ids).where({ kind: "bias" }).orderBy("id").select<{ participant_id: number; result: unknown }[]>("participant_id", "result"),
    q("exclusions").where({ study_id: studyId }).whereNull("revoked_at").select<{ id: number; participant_id: number; scope: string; reason: string }[]>("id", "participant_id", "scope", "reason"),
  ]);
  const bias = new Map<number, number>();
  for (const b of biases) {
    const r = jsonColumn(b.result) as Record<string, number> | null;
    if (r) bias.set(b.participant_id, Math.hypot(r.biasXDegPerS ?? 0, r.biasYDegPerS ?? 0, r.biasZDegPerS ?? 0));
  }
  return rows.map((r) => {
    const design = designOf(r, studyDesign);
    const device = jsonColumn(r.device) as { sampleRateHz?: number | null; sourceKind?: string; verdict?: "ok" | "refused" } | null;
    const summary = jsonColumn(r.device_summary) as { deviceClass?: string; browserFamily?: string; osFamily?: string } | null;
    const e = errors.find((x) => x.participant_id === r.id);
    const errorRate = e && Number(e.n) > 0 ? Number(e.miss) / Number(e.n) : null;
    const mine = exclusions.filter((x) => x.participant_id === r.id);
    const whole = mine.find((x) => x.scope === "participant");
    const sampleRateHz = device?.sampleRateHz ?? null;
    return {
      id: r.id, code: r.code, kind: r.kind, included: Boolean(r.included), source: r.source, status: r.status,
      stage: stageOf(r, design, Number(streams.find((s) => s.participant_id === r.id)?.n ?? 0)),
      deviceVerdict: device?.verdict ?? null, deviceClass: summary?.deviceClass ?? null, browser: summary?.browserFamily ?? null, os: summary?.osFamily ?? null,
      sensorSource: device?.sourceKind ?? null, sampleRateHz,
      completionCode: r.kind === "real" && r.status === "completed" ? r.completion_code : null,
      revoked: r.revoked_at !== null,
      protocolVersion: r.version,
      row: r.cb_row === null ? null : r.cb_row + 1,
      place: placeOf(r, now.getTime(), limit),
      exclusion: whole ? whole.reason : null,
      exclusionId: whole ? whole.id : null,
      excludedSequences: mine.filter((x) => x.scope === "sequence").length,
      flags: qualityFlags({
        status: r.status, sampleRateHz, minSampleRateHz: design?.minSampleRateHz ?? 0, biasDegPerS: bias.get(r.id) ?? null, errorRate,
        lastActivityMs: r.last_activity_at ? r.last_activity_at.getTime() : null, nowMs: now.getTime(),
      }),
      createdAt: r.created_at, lastActivityAt: r.last_activity_at,
      panelId: options.isOwner && r.panel_id_encrypted ? openWithDataKey(r.panel_id_encrypted) : null,
    };
  });
}

function designOf(r: Row, studyDesign: StudyDesign | null): StudyDesign | null {
  if (r.kind === "real") return studyDesign;
  const own = studyDesignSchema.safeParse(jsonColumn(r.pilot_design));
  return own.success ? own.data : studyDesign;
}

function stageOf(r: Row, design: StudyDesign | null, stored: number): string {
  if (r.revoked_at) return "invitation revoked";
  if (r.status === "withdrawn") return "withdrawn";
  if (r.status === "completed") return "complete";
  if (r.status === "invited") return "not started";
  const progress = progressSchema.safeParse(jsonColumn(r.progress));
  const reported = progress.success ? progress.data.stage : "consent";
  // the tasks have started (a place was taken) even if the browser has not yet reported its next stage
  const stage = r.status === "in_progress" && BEFORE_TASKS.has(reported) ? "task" : reported;
  if (stage !== "task") return STAGE_WORDS[stage] ?? stage;
  if (!design) return `task, ${stored} round(s) stored`;
  const planned = design.blocks * conditionsOf(design).length * design.task.amplitudes.length * design.task.widths.length * design.task.sequencesPerAW;
  return `round ${Math.min(stored + 1, planned)} of ${planned}`;
}

function placeOf(r: Row, nowMs: number, limit: number): ParticipantListEntry["place"] {
  if (r.kind !== "real" || r.cb_slot === null) {
    if (r.cb_release_reason === "device") return "released: device check";
    return null;
  }
  if (r.cb_released_at) return r.cb_release_reason === "device" ? "released: device check" : r.cb_release_reason === "withdrawn" ? "released: withdrew" : "released: inactive";
  return holdsPlace({ slot: r.cb_slot, status: r.status, releasedAt: null, lastActivityAt: r.last_activity_at }, nowMs, limit) ? "holds" : "inactive (place free for the next)";
}
