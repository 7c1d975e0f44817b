import { createHash } from "node:crypto";
import { createWriteStream } from "node:fs";
import { rename, unlink } from "node:fs/promises";
import { Readable, Transform, type TransformCallback } from "node:stream";
import { pipeline } from "node:stream/promises";
import { ZipArchive, type Archiver } from "archiver";
import { analysisOptionsSchema } from "../analysis/options";
import { buildResult } from "../analysis/buildResult";
import { sequenceKey } from "../analysis/sequenceInfo";
import { TrialAccumulator } from "../analysis/trialAccumulator";
import type { AnalysisResult } from "../analysis/result";
import type { TrialRow } from "../trials/trialRow";
import { analysisUnitOf, geometryOf } from "../results/analysisUnit";
import { trialRowFromRecord } from "../results/trialRecord";
import { conditionsOf } from "../study/design";
import { formatTrialRow } from "../trials/toTrialCsv";
import { batchCentralDirectory } from "./batchCentralDirectory";
import { buildCodebook } from "./codebook";
import { csvLine } from "./csvLine";
import { buildDataPackage } from "./dataPackage";
import { kAnonymity, type KAnonymityResult } from "./kAnonymity";
import { calibrationRows, calibrationTableSpec, CONFIGURATIONS_FILE, configurationsOf, pathsForArchive, pathsTableSpec } from "./analysisEntries";
import { buildMethods } from "./methods";
import type { ExportOptions } from "./options";
import { participantRows, QUASI_IDENTIFIERS } from "./participantRows";
import { reencodeStream } from "./reencodeStream";
import { cellRows, conditionRows, sequenceRows } from "./resultRows";
import type { ArchiveSource } from "./source";
import {
  cellsTableSpec, conditionsTableSpec, exclusionsTableSpec, participantsTableSpec, questionnairesTableSpec, sequencesTableSpec, trialsTableSpec, type TableSpec,
} from "./tableSpecs";

/** k below this draws a warning (common practice for open data; Sweeney 2002 leaves k to the publisher). */
export const K_ANONYMITY_THRESHOLD = 5;

/** Items of the final questionnaire that leave in participants.csv in coarse categories. */
const CODED_FINAL_ITEMS = new Set(["ageBand", "age_band", "handedness", "experience"]);

export interface ArchiveSummary {
  sha256: string;
  sizeBytes: number;
  files: string[];
  kAnonymity: KAnonymityResult;
  warnings: string[];
  movements: number;
  streams: number;
  /** Movements analysed and removed, conditions summarised. */
  analysis: { movements: number; excluded: number; conditions: number };
}

export type ProgressListener = (fraction: number, stage: string) => void;

/** Counts and hashes the bytes on their way to the file. */
class HashingCounter extends Transform {
  readonly hash = createHash("sha256");
  bytes = 0;
  override _transform(chunk: Buffer, _enc: BufferEncoding, done: TransformCallback): void {
    this.hash.update(chunk);
    this.bytes += chunk.length;
    done(null, chunk);
  }
}

/** Appends one entry and resolves when archiver has written it (so entries are produced one at a time). */
function appendEntry(archive: Archiver, source: Readable | Buffer | string, name: string, store = false): Promise<void> {
  return new Promise((resolve, reject) => {
    const onEntry = (): void => {
      archive.off("error", onError);
      resolve();
    };
    const onError = (e: Error): void => {
      archive.off("entry", onEntry);
      reject(e);
    };
    archive.once("entry", onEntry);
    archive.once("error", onError);
    // Buffers and strings go in as streams: archiver writes a stored Buffer without waiting for
    // the output to drain, so a fast source would pile up in memory; a stream is piped with backpressure.
    // A Buffer goes in as it is (Buffer.from(buffer) would copy every raw stream once more).
    const body = typeof source === "string" ? Readable.from([Buffer.from(source)]) : Buffer.isBuffer(source) ? Readable.from([source]) : source;
    archive.append(body, { name, store });
  });
}

/** Lines from rows, in chunks of ~64 KiB, header first. */
async function* csvChunks(header: readonly string[], rows: AsyncIterable<Record<string, unknown>> | Iterable<Record<string, unknown>>): AsyncGenerator<string> {
  let chunk = csvLine(header) + "\n";
  for await (const row of rows) {
    chunk += csvLine(header.map((h) => row[h] as string | number | null | undefined)) + "\n";
    if (chunk.length > 65_536) {
      yield chunk;
      chunk = "";
    }
  }
  if (chunk) yield chunk;
}

const safe = (s: string): string => s.replace(/[^A-Za-z0-9._-]+/g, "_");

/** Participants per protocol version they ran, in version order (null: none recorded). */
function countVersions(participants: ArchiveSource["participants"]): { version: number | null; participants: number }[] {
  const by = new Map<number | null, number>();
  for (const p of participants) by.set(p.protocolVersion ?? null, (by.get(p.protocolVersion ?? null) ?? 0) + 1);
  return [...by.entries()].sort(([a], [b]) => (a ?? 0) - (b ?? 0)).map(([version, n]) => ({ version, participants: n }));
}

/**
 * Writes the anonymised archive of a study (writeArchive) as a ZIP file at `outPath`.
 *
 * Purpose: open data without direct identifiers: pseudonyms instead of codes; no e-mail, name,
 * token, IP address or user agent (the source does not even offer them); times relative to the
 * session start unless dates are asked for; free text only when chosen; a k-anonymity check over
 * participants.csv. Streamed: every entry is produced while archiver writes it, one at a time,
 * and the ZIP goes straight to disk through a SHA-256 and byte counter (archiver 8; ZIP as in
 * PKWARE's APPNOTE). The file appears at `outPath` only when complete.
 * Cost: O(movements + stream bytes) time; memory O(sequences) for the analysis plus one stream.
 * @throws Error from the source, TrialTableError for inconsistent trials, archiver errors; the
 *   partial file is removed.
 * @example await writeArchive(source, options, pseudonyms, "/tmp/a.zip") // { sha256: "…", sizeBytes: 48213, … }
 */
export async function writeArchive(
  source: ArchiveSource,
  options: ExportOptions,
  pseudonyms: ReadonlyMap<number, string>,
  outPath: string,
  onProgress: ProgressListener = () => {},
): Promise<ArchiveSummary> {
  const { design } = source.study;
  const unit = analysisUnitOf(design.task.unit);
  const conditions = conditionsOf(design);
  const factorNames = design.factors.map((f) => f.name);
  const betweenNames = design.betweenFactors.map((f) => f.name);
  const levelsOf = new Map(conditions.map((c) => [c.label, c.factorLevels]));
  const analysisOptions = analysisOptionsSchema.parse({ start: "actual", exclude: "misfire", unit, geometry: geometryOf(design.task.displayMode), file: "trials.csv" });
  const groupsOf = new Map(source.participants.map((p) => [p.id, p.betweenLevels]));
  const pseudonymOf = (id: number): string => {
    const p = pseudonyms.get(id);
    if (p === undefined) throw new Error(`writeArchive requires a pseudonym for participant ${id}`);
    return p;
  };
  // Rows go in pseudonym order, never in the database's (enrolment) order: otherwise the n-th
  // participant of one archive would be the n-th of another, and of the consent register, whatever
  // the pseudonyms. Sources yield their movements, answers and streams participant by participant
  // in the order of `participants` (ArchiveSource), so sorting it orders every table.
  source.participants.sort((a, b) => (pseudonymOf(a.id) < pseudonymOf(b.id) ? -1 : pseudonymOf(a.id) > pseudonymOf(b.id) ? 1 : 0));

  const files: string[] = [];
  const warnings: string[] = [];
  const tmpPath = `${outPath}.part`;
  const archive = batchCentralDirectory(new ZipArchive({ zlib: { level: 6 } }));
  const counter = new HashingCounter();
  const written = pipeline(archive, counter, createWriteStream(tmpPath));
  written.catch(() => {}); // awaited below; avoid an unhandled rejection while entries are appended
  archive.on("warning", (w) => warnings.push(`archiver: ${w.message}`));

  const streamWeight = options.includeStreams && source.counts.streams > 0 ? 0.6 : 0;
  const trialWeight = 0.95 - streamWeight;
  const add = async (name: string, body: Readable | Buffer | string, store = false): Promise<void> => {
    await appendEntry(archive, body, name, store);
    files.push(name);
  };

  try {
    // trials.csv, feeding the analysis as it goes (the accumulator is dropped once the result is built)
    onProgress(0, "movements");
    const trialsSpec = trialsTableSpec(unit, factorNames, betweenNames);
    let movements = 0;
    /** The sequences trials.csv holds: paths.csv holds only theirs (nothing the source left out). */
    const sequencesWritten = new Set<string>();
    const analyse = async (): Promise<AnalysisResult> => {
      const acc = new TrialAccumulator(analysisOptions);
      async function* trialChunks(): AsyncGenerator<string> {
        let chunk = csvLine(trialsSpec.fields.map((f) => f.name)) + "\n";
        let line = 1;
        for await (const rec of source.trials()) {
          const factors = levelsOf.get(rec.condition);
          if (factors === undefined) throw new Error(`writeArchive: movement of unknown condition "${rec.condition}"`);
          const row: TrialRow & { line?: number } = trialRowFromRecord(rec, pseudonymOf(rec.participant_id), factors);
          row.line = ++line;
          if (betweenNames.length > 0) row.groups = groupsOf.get(rec.participant_id) ?? {};
          sequencesWritten.add(sequenceKey(row.participant, row.condition, row.block, row.sequence));
          acc.add(row);
          chunk += formatTrialRow(row, factorNames, { flags: true, between: betweenNames }) + "\n";
          movements++;
          if (chunk.length > 65_536) {
            yield chunk;
            chunk = "";
            onProgress(trialWeight * Math.min(1, movements / Math.max(1, source.counts.trials)), "movements");
          }
        }
        if (chunk) yield chunk;
      }
      await add("trials.csv", Readable.from(trialChunks()));
      return buildResult(acc, analysisOptions, [...factorNames, ...betweenNames], paths.byKey.size > 0 ? paths.byKey : undefined);
    };
    // path accuracy from the streams (computed on the server, kept in the database)
    const paths = pathsForArchive(source.paths ? (await source.paths()).filter((p) => pseudonyms.has(p.participantId)) : [], pseudonymOf);
    const seqSpec = sequencesTableSpec(unit);
    const cellSpec = cellsTableSpec(unit, factorNames, betweenNames);
    const condSpec = conditionsTableSpec(factorNames, unit);
    const pathSpec = pathsTableSpec(unit);
    /** The summary tables; returns only the few figures the methods text needs, so the sequences can go. */
    const summaries = async () => {
      const result = await analyse();

      onProgress(trialWeight, "summaries");
      await add("sequences.csv", Readable.from(csvChunks(seqSpec.fields.map((f) => f.name), sequenceRows(result.sequences))));
      await add("cells.csv", Readable.from(csvChunks(cellSpec.fields.map((f) => f.name), cellRows(result, factorNames, betweenNames))));
      await add("conditions.csv", Readable.from(csvChunks(condSpec.fields.map((f) => f.name), conditionRows(result, factorNames))));
      paths.rows = paths.rows.filter((r) => sequencesWritten.has(sequenceKey(String(r.participant), String(r.condition), Number(r.block), Number(r.sequence))));
      if (paths.rows.length > 0) await add("paths.csv", Readable.from(csvChunks(pathSpec.fields.map((f) => f.name), paths.rows)));
      const ids = result.sequences.map((q) => q.id).filter(Number.isFinite);
      const ides = result.sequences.map((q) => q.ide).filter(Number.isFinite);
      const range = (xs: number[]): [number, number] | null => (xs.length ? [xs.reduce((m, x) => Math.min(m, x)), xs.reduce((m, x) => Math.max(m, x))] : null);
      const droppedReasons = new Map<string, number>();
      for (const d of result.sequencesDropped) droppedReasons.set(d.reason, (droppedReasons.get(d.reason) ?? 0) + 1);
      return {
        idRange: range(ids), ideRange: range(ides), movements: result.movements, excluded: result.excluded, sequencesDropped: result.sequencesDropped.length, conditionCount: result.conditions.length,
        exclusionCounts: result.exclusions, dropFlagged: result.dropFlagged, timeoutsKept: result.timeoutsKept, geometry: result.geometry,
        sequencesDroppedReasons: [...droppedReasons].map(([reason, sequences]) => ({ reason, sequences })),
        missing: { participantsExcluded: result.missing.participantsExcluded, participantsIncluded: result.missing.participantsIncluded, participants: result.missing.participants },
        withData: new Set(result.sequences.map((q) => q.participant)).size,
        pathMovements: result.pathMovements?.length ?? 0,
      };
    };
    const facts = await summaries();

    // participants.csv and the k-anonymity check
    const partSpec = participantsTableSpec(betweenNames, options.includeDates);
    const partRows = participantRows(source.participants, pseudonyms, betweenNames, options.includeDates);
    // every quasi-identifier participants.csv writes: the coarsened answers, the between groups, the session's length and, when included, its dates
    const quasi = [...QUASI_IDENTIFIERS, ...betweenNames.map((b) => `between_${b}`), "session_minutes", ...(options.includeDates ? ["started_at", "completed_at"] : [])];
    const k = kAnonymity(partRows, quasi, K_ANONYMITY_THRESHOLD);
    if (partRows.length > 0 && k.k < K_ANONYMITY_THRESHOLD) {
      warnings.push(
        `participants.csv is only ${k.k}-anonymous over ${k.quasiIdentifiers.join(", ")} (below k = ${K_ANONYMITY_THRESHOLD}): ${k.smallGroups.length} group(s) have fewer than ${K_ANONYMITY_THRESHOLD} participants. Consider leaving those columns out before sharing.`,
      );
    }
    await add("participants.csv", Readable.from(csvChunks(partSpec.fields.map((f) => f.name), partRows)));

    // exclusions.csv: what the team left out, with the reason and the movements removed
    const exclSpec = exclusionsTableSpec();
    const exclusions = (source.exclusions ?? []).filter((e) => pseudonyms.has(e.participantId));
    await add("exclusions.csv", Readable.from(csvChunks(exclSpec.fields.map((f) => f.name), exclusions.map((e) => ({
      participant: pseudonymOf(e.participantId), scope: e.scope, condition: e.condition, block: e.block, sequence: e.sequence, reason: e.reason, movements: e.movements,
    })))));

    // questionnaires.csv: ratings; free text only when chosen
    const qSpec = questionnairesTableSpec(options.includeDates);
    const startOf = new Map(source.participants.map((p) => [p.id, p.startedAt]));
    let freeTextLeftOut = 0;
    async function* answerRows(): AsyncGenerator<Record<string, unknown>> {
      for await (const a of source.answers()) {
        if (!startOf.has(a.participantId)) continue;
        if (a.condition === "" && CODED_FINAL_ITEMS.has(a.itemId)) continue; // in participants.csv, coarsened
        const isText = a.valueText !== null && a.valueText !== "";
        if (isText && !options.includeFreeText) {
          freeTextLeftOut++;
          if (a.valueInt === null) continue;
        }
        const start = startOf.get(a.participantId) ?? null;
        yield {
          participant: pseudonymOf(a.participantId),
          condition: a.condition,
          item: a.itemId,
          value: a.valueInt,
          text: isText && options.includeFreeText ? a.valueText : null,
          answered_at: options.includeDates ? a.answeredAt.toISOString() : undefined,
          answered_s: !options.includeDates && start ? Math.round((a.answeredAt.getTime() - start.getTime()) / 1000) : null,
        };
      }
    }
    await add("questionnaires.csv", Readable.from(csvChunks(qSpec.fields.map((f) => f.name), answerRows())));

    // configurations.json (always) and calibration.csv (with the streams): what `analyze --archive` replays the streams with
    await add(CONFIGURATIONS_FILE, JSON.stringify(configurationsOf(design), null, 2) + "\n");
    const calSpec = calibrationTableSpec();
    const withCalibration = options.includeStreams && source.calibrations !== undefined;
    if (withCalibration) {
      const cals = await source.calibrations!();
      await add("calibration.csv", Readable.from(csvChunks(calSpec.fields.map((f) => f.name), calibrationRows(source.participants, cals, pseudonymOf))));
    }

    // streams/: the stored gzip replay CSVs, one at a time, re-encoded (only the format's columns, validated, a plain gzip header)
    let streams = 0;
    let unreadable = 0;
    if (options.includeStreams) {
      for await (const s of source.streams()) {
        if (!startOf.has(s.participantId)) continue;
        const data = await s.read();
        if (!data) continue;
        const name = `streams/${safe(pseudonymOf(s.participantId))}/b${s.block}-c${s.conditionIndex + 1}-s${s.sequence}${s.practice ? "-practice" : ""}.csv.gz`;
        let clean: Buffer;
        try {
          clean = reencodeStream(data, name);
        } catch {
          unreadable++;
          continue;
        }
        await add(name, clean, true);
        streams++;
        if (streams % 20 === 0) onProgress(trialWeight + streamWeight * Math.min(1, streams / Math.max(1, source.counts.streams)), "raw streams");
      }
    }

    if (unreadable > 0) warnings.push(`${unreadable} stored stream(s) are not in the stream format and were left out of streams/.`);

    onProgress(0.96, "descriptions");
    const tables: TableSpec[] = [trialsSpec, seqSpec, cellSpec, condSpec, ...(paths.rows.length > 0 ? [pathSpec] : []), partSpec, exclSpec, qSpec, ...(withCalibration ? [calSpec] : [])];
    const notes = [
      `Participants are named by ${options.pseudonyms === "stable" ? "stable pseudonyms (a keyed hash; the same in every archive of this study)" : "random pseudonyms drawn for this archive only"}; participant codes, e-mail addresses, names, session links, IP addresses and user agents are not in the archive.`,
      options.includeDates ? "Calendar dates are included (the researcher chose so)." : "Times are relative to each participant's session start; no calendar dates.",
      options.includeFreeText ? "Free-text answers are included (the researcher chose so)." : `Free-text answers are left out (${freeTextLeftOut} left out).`,
      `k-anonymity of participants.csv over ${k.quasiIdentifiers.join(", ")}: k = ${k.k}${k.k < K_ANONYMITY_THRESHOLD ? ` (below ${K_ANONYMITY_THRESHOLD}: take care)` : ""}.`,
      "Consent records are not in the archive; the consent documents' texts are, under consent/.",
      "Withdrawn participants are left out.",
      "Text cells that would begin with =, +, -, @, a tab or a carriage return begin with a single quote (') instead, so that a spreadsheet shows them as text and never runs them as formulas (OWASP, CSV Injection); numbers are never changed. Remove that quote before comparing such labels or answers with the study's own.",
      `Exclusions by the research team: ${exclusions.filter((e) => e.scope === "participant").length} participant(s) and ${exclusions.filter((e) => e.scope === "sequence").length} sequence(s), ${exclusions.reduce((a, e) => a + e.movements, 0)} movements; they are listed with their reasons in exclusions.csv and not in trials.csv.`,
    ];
    notes.push(
      `${CONFIGURATIONS_FILE} holds the task and each condition's full transfer configuration under its number (the c<number> of the stream files, the order of conditions.csv); with the raw streams and calibration.csv, \`npm run analyze -- --archive FILE.zip\` replays them and recomputes every table, path accuracy included.`,
      paths.rows.length > 0
        ? `paths.csv holds path accuracy for ${paths.rows.length} movements, computed from the raw streams; conditions.csv has their means (path_*).`
        : "No path accuracy: no sequence had a stored stream that reproduced its recorded selections.",
    );
    const streamSection = options.includeStreams
      ? ["## streams/", "", "One gzip file per sequence, `streams/<participant>/b<block>-c<condition number>-s<sequence>.csv.gz`, in the raw sensor stream format: `t_ms, gyro_x, gyro_y, gyro_z` (deg/s about the device axes of the W3C Device Orientation and Motion specification), `accel_x, accel_y, accel_z` (m/s², including gravity), `stick_x, stick_y` (−1..1), `buttons` (bitmask), `screen_angle` (deg); `npm run replay` reads them. Condition numbers count from 1 in the order of conditions.csv. Each file is written anew for the archive from the validated samples (only the format's columns; a gzip header without file name or time stamp).", ""]
      : [];
    const descriptor = buildDataPackage(
      { id: source.study.id, title: source.study.title, description: "Anonymised data of a motion-aiming pointing study (ISO 9241-411 measures), exported from Yawpoint.", created: new Date() },
      tables,
    );
    await add("datapackage.json", JSON.stringify(descriptor, null, 2) + "\n");
    await add("codebook.md", buildCodebook(source.study.title, tables, notes, streamSection));
    await add(
      "methods.md",
      buildMethods(source.study.title, design, {
        participants: source.participants.length,
        completed: source.participants.filter((p) => p.status === "completed").length,
        recruitment: source.recruitment,
        ...facts,
        conditions: conditions.map((c) => c.label),
        researcherExclusions: exclusions.map((e) => ({ scope: e.scope, reason: e.reason, movements: e.movements })),
        protocolVersions: countVersions(source.participants),
        start: analysisOptions.start,
        exclude: analysisOptions.exclude,
        unit: design.task.unit,
      }),
    );
    for (const v of source.consentVersions) {
      await add(`consent/consent-v${v.version}.md`, `<!-- consent version ${v.version}, ${v.status}, SHA-256 ${v.sha256 ?? "not frozen"} -->\n${v.bodyMd}`);
    }
    void archive.finalize();
    await written;
    await rename(tmpPath, outPath);
    onProgress(1, "done");
    return { sha256: counter.hash.digest("hex"), sizeBytes: counter.bytes, files, kAnonymity: k, warnings, movements, streams, analysis: { movements: facts.movements, excluded: facts.excluded, conditions: facts.conditionCount } };
  } catch (err) {
    archive.abort();
    await written.catch(() => {});
    await unlink(tmpPath).catch(() => {});
    throw err;
  }
}
