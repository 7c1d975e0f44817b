import { createHash } from "node:crypto";
import { gunzipSync } from "node:zlib";
import { z } from "zod";
import { movementKey, PATH_KEYS, type PathAccuracy } from "@/lib/analysis";
import type { Queryable } from "@/lib/db";
import { fetchCalibrations } from "@/lib/data/results";
import {
  geometryOf, NO_CALIBRATION, type PathStatus, PATH_METHOD_VERSION, pathMovementsOf, replaySetupFor, streamPaths, type ResultsParticipant, type TrialRecord,
} from "@/lib/results";
import type { StoredPath } from "@/lib/export/analysisEntries";
import { conditionConfig, conditionsOf, type StudyDesign } from "@/lib/study/design";


const storedSchema = z.array(z.object({ trial: z.number().int(), tre: z.number(), tac: z.number(), mdc: z.number(), odc: z.number(), mv: z.number().nullable(), me: z.number(), mo: z.number() }));

const parseJson = (v: unknown): unknown => (typeof v === "string" ? JSON.parse(v) : v);

/**
 * Path accuracy of every recorded sequence of a study's participants (studyPathMeasures), for the
 * results page: each sequence's stream is replayed through its condition's configuration with the
 * participant's calibration (streamPaths) once, and the result is kept in path_measures under a
 * hash of its inputs, so a later request reads it back unless the design, the calibration or the
 * method changed. At most `budgetMs` is spent computing per call; what remains is reported as
 * pending and computed by the next call. Keys are movementKey(code, condition, block, sequence, trial).
 * Cost: O(stored results) reads; O(samples) per sequence computed.
 * @throws database errors.
 */
export async function studyPathMeasures(
  q: Queryable,
  design: StudyDesign,
  participants: readonly ResultsParticipant[],
  records: readonly TrialRecord[],
  budgetMs = 4000,
): Promise<{ measures: Map<string, PathAccuracy>; status: PathStatus }> {
  const codeOf = new Map(participants.map((p) => [p.id, p.code]));
  const { entries, status } = await pathEntries(q, design, participants, records, budgetMs);
  const measures = new Map<string, PathAccuracy>();
  for (const e of entries) measures.set(movementKey(codeOf.get(e.participantId)!, e.condition, e.block, e.sequence, e.trial), e.measures);
  return { measures, status };
}

/**
 * studyPathMeasures' work, by participant id (pathEntries): the path measures of every movement
 * that has them, and the status. The archive uses it one participant at a time.
 * Cost and throws as studyPathMeasures.
 */
export async function pathEntries(
  q: Queryable,
  design: StudyDesign,
  participants: readonly Pick<ResultsParticipant, "id" | "code" | "status">[],
  records: readonly TrialRecord[],
  budgetMs = Number.POSITIVE_INFINITY,
): Promise<{ entries: StoredPath[]; status: PathStatus }> {
  const people = participants.filter((p) => p.status !== "withdrawn");
  const codeOf = new Map(people.map((p) => [p.id, p.code]));
  const entries: StoredPath[] = [];
  const status: PathStatus = { sequences: 0, computed: 0, pending: 0, notComputable: [] };
  if (people.length === 0) return { entries, status };
  const streams = await q("sequence_streams")
    .whereIn("participant_id", people.map((p) => p.id))
    .andWhere("practice", false)
    .whereNotNull("stream_gz")
    .orderBy("id")
    .select<{ id: number; participant_id: number; condition: string; block: number; sequence: number }[]>("id", "participant_id", "condition", "block", "sequence");
  if (streams.length === 0) return { entries, status };
  const cached = new Map(
    (await q("path_measures").whereIn("stream_id", streams.map((s) => s.id)).select<{ stream_id: number; inputs_hash: string; measures: unknown; note: string | null }[]>("stream_id", "inputs_hash", "measures", "note")).map((r) => [Number(r.stream_id), r]),
  );
  const calibrations = await fetchCalibrations(q, people.map((p) => p.id));
  const conditions = new Map(conditionsOf(design).map((c) => [c.label, c]));
  const bySequence = new Map<string, TrialRecord[]>();
  for (const r of records) {
    const key = `${r.participant_id}\u0000${r.condition}\u0000${Number(r.block)}\u0000${Number(r.sequence)}`;
    const list = bySequence.get(key) ?? [];
    list.push(r);
    bySequence.set(key, list);
  }
  const geometry = geometryOf(design.task.displayMode);
  const started = Date.now();
  for (const s of streams) {
    const code = codeOf.get(s.participant_id)!;
    const rows = bySequence.get(`${s.participant_id}\u0000${s.condition}\u0000${s.block}\u0000${s.sequence}`) ?? [];
    const condition = conditions.get(s.condition);
    if (rows.length === 0 || condition === undefined) continue;
    status.sequences++;
    const calibration = calibrations.get(s.participant_id) ?? NO_CALIBRATION;
    const config = { ...conditionConfig(design, condition), ...calibration.bias };
    const setup = replaySetupFor(design.task, Number(rows[0]!.amplitude), calibration);
    const hash = createHash("sha256").update(JSON.stringify([PATH_METHOD_VERSION, config, setup, geometry, design.task.type])).digest("hex");
    const ident = { participant: code, condition: s.condition, block: s.block, sequence: s.sequence };
    let stored = cached.get(s.id);
    if (stored?.inputs_hash !== hash) {
      if (Date.now() - started > budgetMs) {
        status.pending++;
        continue;
      }
      const row = await computeOne(q, s.id, s.participant_id, hash, config, setup, rows, geometry, design.task.type);
      stored = { stream_id: s.id, inputs_hash: hash, ...row };
    }
    if (stored.note !== null) {
      status.notComputable.push({ ...ident, reason: stored.note });
      continue;
    }
    const parsed = storedSchema.safeParse(parseJson(stored.measures));
    if (!parsed.success) continue;
    status.computed++;
    for (const m of parsed.data) {
      const value = { tre: 0, tac: 0, mdc: 0, odc: 0, mv: 0, me: 0, mo: 0 };
      for (const k of PATH_KEYS) value[k] = m[k] ?? Number.NaN;
      entries.push({ participantId: s.participant_id, condition: s.condition, block: s.block, sequence: s.sequence, trial: m.trial, measures: value });
    }
  }
  return { entries, status };
}

async function computeOne(
  q: Queryable,
  streamId: number,
  participantId: number,
  hash: string,
  config: Parameters<typeof streamPaths>[1],
  setup: ReturnType<typeof replaySetupFor>,
  rows: readonly TrialRecord[],
  geometry: "plane" | "sphere",
  task: "ring" | "strip",
): Promise<{ measures: string | null; note: string | null }> {
  let measures: string | null = null;
  let note: string | null = null;
  let residual: number | null = null;
  if ("reason" in setup) {
    note = `not replayable: ${setup.reason}`;
  } else {
    const row = await q("sequence_streams").where({ id: streamId }).first<{ stream_gz: Buffer | null } | undefined>("stream_gz");
    let text: string | null = null;
    try {
      text = row?.stream_gz ? gunzipSync(row.stream_gz).toString("utf8") : null;
    } catch (e) {
      note = `the stored stream could not be decompressed: ${(e as Error).message}`;
    }
    if (text !== null) {
      const r = streamPaths(text, config, setup, pathMovementsOf(rows), { geometry, task });
      residual = r.residual;
      if (r.ok) measures = JSON.stringify([...r.measures].map(([trial, m]) => ({ trial, ...m, mv: Number.isFinite(m.mv) ? m.mv : null })));
      else note = r.reason;
    } else note ??= "no stream stored";
  }
  const values = { participant_id: participantId, stream_id: streamId, inputs_hash: hash, measures, residual, note: note?.slice(0, 300) ?? null, computed_at: new Date() };
  await q("path_measures").insert(values).onConflict("stream_id").merge();
  return { measures, note: values.note };
}
