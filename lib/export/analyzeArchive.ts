import { readFile } from "node:fs/promises";
import { Readable } from "node:stream";
import { gunzipSync } from "node:zlib";
import { parse } from "csv-parse/sync";
import { strFromU8, unzipSync } from "fflate";
import { analyzeTrialStream, movementKey, PATH_KEYS, type AnalysisOptionsInput, type AnalysisResult, type PathAccuracy } from "../analysis";
import { NO_CALIBRATION, replaySetupFor, type ParticipantCalibration } from "../results/participantCalibration";
import { streamPaths } from "../results/streamPaths";
import type { RecordedMovement } from "../results/sequencePathMeasures";
import { readTrialTable } from "../trials/readTrialTable";
import { TrialTableError } from "../trials/trialTableError";
import { CONFIGURATIONS_FILE, configurationsSchema, type Configurations } from "./analysisEntries";

/** Where an archive's path measures came from. */
export type PathSource = "streams" | "paths.csv" | null;

/** What analyzeArchive adds to the analysis. */
export interface ArchiveAnalysis {
  result: AnalysisResult;
  pathSource: PathSource;
  /** Streams whose paths could not be computed, with the reason. */
  pathProblems: { stream: string; reason: string }[];
}

/** streams/<pseudonym>/b<block>-c<condition number>-s<sequence>[-practice].csv.gz (writeArchive's names). */
const STREAM_NAME = /^streams\/([^/]+)\/b(\d+)-c(\d+)-s(\d+)(-practice)?\.csv\.gz$/;

const number = (v: string | undefined): number | null => (v === undefined || v.trim() === "" ? null : Number(v));

/** calibration.csv rows by pseudonym (numbers as the archive wrote them; empty cells mean not measured). */
function readCalibrations(text: string): Map<string, ParticipantCalibration> {
  const rows = parse(text, { columns: true, skip_empty_lines: true, bom: true }) as Record<string, string>[];
  const out = new Map<string, ParticipantCalibration>();
  for (const r of rows) {
    const bias: ParticipantCalibration["bias"] = {};
    const bx = number(r.bias_x), by = number(r.bias_y), bz = number(r.bias_z);
    if (bx !== null) bias.biasXDegPerS = bx;
    if (by !== null) bias.biasYDegPerS = by;
    if (bz !== null) bias.biasZDegPerS = bz;
    out.set(r.participant ?? "", { bias, pixelsPerMm: number(r.pixels_per_mm), viewingDistanceMm: number(r.viewing_distance_mm) });
  }
  return out;
}

/** paths.csv rows, keyed by movementKey. */
function readPaths(text: string): Map<string, PathAccuracy> {
  const rows = parse(text, { columns: true, skip_empty_lines: true, bom: true }) as Record<string, string>[];
  const out = new Map<string, PathAccuracy>();
  for (const r of rows) {
    const m = { tre: 0, tac: 0, mdc: 0, odc: 0, mv: 0, me: 0, mo: 0 };
    for (const k of PATH_KEYS) m[k] = number(r[k]) ?? Number.NaN;
    out.set(movementKey(r.participant ?? "", r.condition ?? "", Number(r.block), Number(r.sequence), Number(r.trial)), m);
  }
  return out;
}

/**
 * Analyses an archive that Yawpoint wrote (analyzeArchive), as `npm run analyze -- --archive
 * FILE.zip` does: trials.csv with the unit and geometry of configurations.json, and path accuracy —
 * recomputed from the raw streams (streams/, replayed through each condition's configuration with
 * calibration.csv, exactly as the server computes it: streamPaths) when the archive carries them,
 * else read from paths.csv. The exclusion options are the caller's.
 * Cost: O(archive bytes + samples).
 * @throws TrialTableError naming `FILE.zip/ENTRY`, the line and the column, for a missing or bad entry.
 * @example (await analyzeArchive("study.zip", {})).pathSource // "streams"
 */
export async function analyzeArchive(path: string, options: AnalysisOptionsInput, label = path): Promise<ArchiveAnalysis> {
  let entries: Record<string, Uint8Array>;
  try {
    entries = unzipSync(new Uint8Array(await readFile(path)));
  } catch (e) {
    throw new TrialTableError({ file: label, line: 1, column: "(file)" }, `cannot read the archive: ${(e as Error).message}`);
  }
  const trialsBytes = entries["trials.csv"];
  if (!trialsBytes) throw new TrialTableError({ file: label, line: 1, column: "(archive)" }, "no trials.csv in the archive");
  let configurations: Configurations | null = null;
  const configBytes = entries[CONFIGURATIONS_FILE];
  if (configBytes) {
    const parsed = configurationsSchema.safeParse(JSON.parse(strFromU8(configBytes)));
    if (!parsed.success) {
      const issue = parsed.error.issues[0]!;
      throw new TrialTableError({ file: `${label}/${CONFIGURATIONS_FILE}`, line: 1, column: issue.path.join(".") || "(file)" }, issue.message);
    }
    configurations = parsed.data;
  }
  const trialsText = strFromU8(trialsBytes);
  const trialsFile = `${label}/trials.csv`;
  const opts: AnalysisOptionsInput = {
    ...options,
    file: trialsFile,
    ...(configurations ? { unit: configurations.task.analysisUnit, geometry: configurations.task.geometry } : {}),
  };

  let pathSource: PathSource = null;
  let measures: Map<string, PathAccuracy> | undefined;
  const pathProblems: ArchiveAnalysis["pathProblems"] = [];
  const streamNames = Object.keys(entries).filter((n) => STREAM_NAME.test(n) && !n.endsWith("-practice.csv.gz"));
  if (configurations && streamNames.length > 0) {
    pathSource = "streams";
    measures = new Map();
    const calibrations = entries["calibration.csv"] ? readCalibrations(strFromU8(entries["calibration.csv"])) : new Map<string, ParticipantCalibration>();
    const rows = await readTrialTable(Readable.from([trialsText]), { file: trialsFile });
    const bySequence = new Map<string, { amplitude: number; movements: RecordedMovement[] }>();
    for (const r of rows) {
      const key = `${r.participant}\u0000${r.condition}\u0000${r.block}\u0000${r.sequence}`;
      const seq = bySequence.get(key) ?? { amplitude: r.amplitude, movements: [] };
      seq.movements.push({ trial: r.trial, from: { x: r.fromX, y: r.fromY }, to: { x: r.toX, y: r.toY }, start: { x: r.startX, y: r.startY }, end: { x: r.endX, y: r.endY }, timeMs: r.timeMs, width: r.width });
      bySequence.set(key, seq);
    }
    const byNumber = new Map(configurations.conditions.map((c) => [c.number, c]));
    for (const name of streamNames) {
      const [, participant, block, number, sequence] = STREAM_NAME.exec(name)!;
      const condition = byNumber.get(Number(number));
      if (!condition) {
        pathProblems.push({ stream: name, reason: `no condition ${number} in ${CONFIGURATIONS_FILE}` });
        continue;
      }
      const seq = bySequence.get(`${participant}\u0000${condition.condition}\u0000${Number(block)}\u0000${Number(sequence)}`);
      if (!seq) continue;
      const calibration = calibrations.get(participant!) ?? NO_CALIBRATION;
      const setup = replaySetupFor(configurations.task, seq.amplitude, calibration);
      if ("reason" in setup) {
        pathProblems.push({ stream: name, reason: setup.reason });
        continue;
      }
      let text: string;
      try {
        text = gunzipSync(entries[name]!).toString("utf8");
      } catch (e) {
        pathProblems.push({ stream: name, reason: `not a gzip stream: ${(e as Error).message}` });
        continue;
      }
      const r = streamPaths(text, { ...condition.configuration, ...calibration.bias }, setup, seq.movements, { geometry: configurations.task.geometry, task: configurations.task.type }, `${label}/${name}`);
      if (!r.ok) {
        pathProblems.push({ stream: name, reason: r.reason });
        continue;
      }
      for (const [trial, m] of r.measures) measures.set(movementKey(participant!, condition.condition, Number(block), Number(sequence), trial), m);
    }
  } else if (entries["paths.csv"]) {
    pathSource = "paths.csv";
    measures = readPaths(strFromU8(entries["paths.csv"]));
  }
  const result = await analyzeTrialStream(Readable.from([trialsText]), opts, measures);
  if (pathSource === "streams") result.notes.push(`path accuracy recomputed from ${streamNames.length} raw streams${pathProblems.length ? `; ${pathProblems.length} could not be replayed: ${[...new Set(pathProblems.map((p) => p.reason))].slice(0, 3).join("; ")}` : ""}`);
  if (pathSource === "paths.csv") result.notes.push("path accuracy read from the archive's paths.csv (no raw streams in the archive)");
  return { result, pathSource, pathProblems };
}
