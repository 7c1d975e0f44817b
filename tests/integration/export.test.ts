import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { gunzipSync } from "node:zlib";
import { parse } from "csv-parse/sync";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { FINISHED_STUDY } from "@/db/seeds/demo-finished-study";
import { DEMO_PEOPLE } from "@/db/seeds/demo-scenario";
import { seedDemo } from "@/db/seeds/demo";
import { db } from "@/lib/db";
import { databaseArchiveSource, fetchConsentRegister, fetchExportFile, fetchExportJob, insertExportJob, pseudonymSecret } from "@/lib/data/exports";
import { startExportProcess } from "@/lib/data/exportProcess";
import { fetchResultsParticipants, fetchStudyDesign, fetchStudyTrialRecords } from "@/lib/data/results";
import { randomPseudonyms, stablePseudonym, validateDataPackage, valueMatchesFieldType, writeArchive, type ExportOptions } from "@/lib/export";
import { buildResultsView } from "@/lib/results";
import { sealWithDataKey } from "@/lib/recruitment/dataKey";
import { readZip } from "../fixtures/readZip";

const dir = mkdtempSync(join(tmpdir(), "yawpoint-export-it-"));
let studyId = 0;
const LEAKY = {
  token: "tok-Zq8vW3xY5pL0nR2sT4uV6wX8yA1bC3dE",
  email: "lena.virtanen.participant@mailbox.example",
  typedName: "Lena Marjatta Virtanen",
  ip: "203.0.113.77",
  userAgent: "Mozilla/5.0 (Linux; Android 14; Pixel 8 Build/UQ1A) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0 Mobile Safari/537.36",
  panelId: "PANEL-5bd1e9c0a7", // a recruitment panel's participant id: kept for matching payments, never exported
};
let needles: string[] = [];

async function buildArchive(name: string, options: ExportOptions, pseudonyms?: Map<number, string>) {
  const source = await databaseArchiveSource(db, studyId);
  const ids = source.participants.map((p) => p.id);
  const map = pseudonyms ?? randomPseudonyms(ids);
  const path = join(dir, `${name}.zip`);
  const summary = await writeArchive(source, options, map, path);
  return { path, summary, files: await readZip(path), pseudonyms: map };
}

beforeAll(async () => {
  await seedDemo(db);
  const study = await db("studies").where({ title: FINISHED_STUDY.title }).first<{ id: number }>("id");
  studyId = study.id;
  // One participant carries every kind of identifier a careless session could leave in the tables.
  const p = await db("participants").where({ study_id: studyId }).orderBy("id").first<{ id: number; code: string }>("id", "code");
  await db("participants").where({ id: p.id }).update({
    token_hash: createHash("sha256").update(LEAKY.token).digest("hex"),
    device: JSON.stringify({ inputs: ["gyroscope"], ip: LEAKY.ip, userAgent: LEAKY.userAgent }),
    panel_id_encrypted: sealWithDataKey(LEAKY.panelId),
  });
  await db("participant_contacts").insert({ participant_id: p.id, email_encrypted: `plain-for-test:${LEAKY.email}` }).onConflict("participant_id").merge();
  await db("consent_records").where({ participant_id: p.id }).update({ typed_name_encrypted: sealWithDataKey(LEAKY.typedName), device_summary: JSON.stringify({ ip: LEAKY.ip, userAgent: LEAKY.userAgent }) });
  await db("questionnaire_answers").where({ participant_id: p.id, item_id: "comments" }).delete();
  await db("questionnaire_answers").insert({ participant_id: p.id, condition: "", item_id: "comments", value_text: `write to ${LEAKY.email}, ${LEAKY.typedName}` });
  const codes = (await db("participants").where({ study_id: studyId }).select("code", "token_hash", "completion_code")) as { code: string; token_hash: string; completion_code: string | null }[];
  needles = [
    ...DEMO_PEOPLE.flatMap((u) => [u.email, u.name, u.password]),
    LEAKY.token, createHash("sha256").update(LEAKY.token).digest("hex"), LEAKY.email, LEAKY.typedName, LEAKY.ip, "Pixel 8 Build", "Mozilla/5.0", LEAKY.panelId,
    ...codes.flatMap((c) => [c.code, c.token_hash, c.completion_code ?? ""]),
  ].filter((s) => s.length >= 6);
});

afterAll(async () => {
  rmSync(dir, { recursive: true, force: true });
  await db.destroy();
});

/** Every file's text, stream files decompressed, for the identifier scan. */
function texts(files: Map<string, Buffer>): [string, string][] {
  return [...files].map(([name, buf]) => [name, (name.endsWith(".gz") ? gunzipSync(buf) : buf).toString("utf8")]);
}

describe("anonymised archive of the finished demo study", () => {
  it("holds none of the seeded e-mails, names, passwords, tokens, codes, IP addresses or user agents in any file (streams decompressed)", async () => {
    const { files, summary } = await buildArchive("full", { pseudonyms: "stable", includeStreams: true, includeDates: true, includeFreeText: false });
    expect(files.size).toBeGreaterThan(12 * 4 * 9); // streams included: one per sequence, practice too
    expect(summary.streams).toBe(12 * 4 * 9);
    expect(needles.length).toBeGreaterThan(40);
    for (const [name, text] of texts(files)) {
      const lower = text.toLowerCase();
      for (const n of needles) expect(lower.includes(n.toLowerCase()), `${n} found in ${name}`).toBe(false);
    }
    // the register, by contrast, is identified
    const register = await fetchConsentRegister(db, studyId);
    expect(register.some((r) => r.typedName === LEAKY.typedName)).toBe(true);
  });

  it("leaves free text out unless chosen, and then includes it", async () => {
    const off = await buildArchive("no-text", { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: false });
    expect(off.files.get("questionnaires.csv")!.toString()).not.toContain("write to");
    const on = await buildArchive("with-text", { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: true });
    expect(on.files.get("questionnaires.csv")!.toString()).toContain("Dragging was easy.");
    expect([...on.files.keys()].some((n) => n.startsWith("streams/"))).toBe(false);
  });

  it("uses no calendar dates unless asked: no ISO date of 2026 anywhere, times relative to the session start", async () => {
    const { files } = await buildArchive("relative", { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: false });
    for (const [name, text] of texts(files)) {
      if (name === "datapackage.json") continue; // its "created" is the export's own time
      expect(/2026-\d\d-\d\d/.test(text), name).toBe(false);
    }
    const q = parse(files.get("questionnaires.csv")!, { columns: true }) as Record<string, string>[];
    expect(q.length).toBe(12 * 4); // effort per condition; final items are in participants.csv
    for (const r of q) expect(Number(r.answered_s)).toBeGreaterThan(0);
  });

  it("stable pseudonyms come from the study's keyed hash and repeat across archives; random ones do not", async () => {
    const secret = await pseudonymSecret(db, studyId);
    expect(await pseudonymSecret(db, studyId)).toBe(secret);
    const ids = (await databaseArchiveSource(db, studyId)).participants.map((p) => p.id);
    const stable = new Map(ids.map((id) => [id, stablePseudonym(secret, id)]));
    const a = await buildArchive("stable-a", { pseudonyms: "stable", includeStreams: false, includeDates: false, includeFreeText: false }, stable);
    const people = (parse(a.files.get("participants.csv")!, { columns: true }) as Record<string, string>[]).map((r) => r.participant!).sort();
    expect(people).toEqual([...stable.values()].sort());
    expect(new Set(people).size).toBe(12);
  });

  it("datapackage.json validates against Frictionless Data Package v1 and Table Schema v1, and every CSV matches its schema", async () => {
    const { files, summary } = await buildArchive("dp", { pseudonyms: "random", includeStreams: false, includeDates: true, includeFreeText: true });
    const descriptor = JSON.parse(files.get("datapackage.json")!.toString()) as { resources: { name: string; path: string; schema: { fields: { name: string; type: string; unit?: string; description?: string; constraints?: { required?: boolean } }[] } }[] };
    expect(validateDataPackage(descriptor)).toEqual([]);
    expect(descriptor.resources.map((r) => r.path).sort()).toEqual(["cells.csv", "conditions.csv", "exclusions.csv", "participants.csv", "paths.csv", "questionnaires.csv", "sequences.csv", "trials.csv"]);
    for (const r of descriptor.resources) {
      const text = files.get(r.path)!.toString("utf8");
      const rows = parse(text, { relax_column_count: false }) as string[][];
      expect(rows[0], r.path).toEqual(r.schema.fields.map((f) => f.name));
      for (const f of r.schema.fields) expect(f.description, `${r.path}:${f.name}`).toBeTruthy();
      for (const row of rows.slice(1)) {
        r.schema.fields.forEach((f, i) => {
          expect(valueMatchesFieldType(row[i]!, f.type), `${r.path} ${f.name}="${row[i]}" as ${f.type}`).toBe(true);
          if (f.constraints?.required) expect(row[i], `${r.path} ${f.name} required`).not.toBe("");
        });
      }
    }
    const trials = descriptor.resources.find((r) => r.name === "trials")!;
    expect(trials.schema.fields.find((f) => f.name === "time_ms")!.unit).toBe("ms");
    expect(trials.schema.fields.find((f) => f.name === "end_x")!.unit).toBe("px");
    // k-anonymity: 12 people over age band × handedness × experience cannot reach k = 5
    expect(summary.kAnonymity.k).toBeLessThan(5);
    expect(summary.warnings.some((w) => w.includes("below k = 5"))).toBe(true);
    expect(files.get("codebook.md")!.toString()).toContain("k-anonymity");
    const methods = files.get("methods.md")!.toString();
    for (const s of ["balanced Latin square (Williams 1949)", "We = 4.133", "TP = IDe/MT", "A/2", "240 and 480", "24 and 60", "Soukoreff"]) expect(methods).toContain(s);
    expect(files.get("consent/consent-v1.md")!.toString()).toContain("Taking part in the aiming pilot");
  });

  it("reading the archive's trials.csv through the analyze CLI gives the results page's numbers", async () => {
    const { files, pseudonyms } = await buildArchive("cli", { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: false });
    const csvPath = join(dir, "trials.csv");
    writeFileSync(csvPath, files.get("trials.csv")!);
    const cli = JSON.parse(execFileSync("npx", ["tsx", "--no-warnings", "experiments/cli/analyze.ts", csvPath, "--json"], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 })) as {
      excluded: number; conditions: { condition: string; n: number; tp: { mean: number; ci95: [number, number] }; mt: { mean: number }; errorRate: { mean: number } }[];
      regression: { condition: string; intercept: number; slope: number; r2: number }[]; anova: { effect: string; F: number; p: number; df1: number; df2: number }[];
      posthoc: { a: string; b: string; t: number; pHolm: number }[]; cells: { participant: string; condition: string; tp: number }[];
    };
    const design = (await fetchStudyDesign(db, studyId))!;
    const page = buildResultsView(design, await fetchResultsParticipants(db, studyId), await fetchStudyTrialRecords(db, studyId)).analysis!;
    expect(cli.excluded).toBe(page.excluded);
    expect(cli.conditions.map((c) => c.condition)).toEqual(page.conditions.map((c) => c.condition));
    cli.conditions.forEach((c, i) => {
      const p = page.conditions[i]!;
      expect(c.n).toBe(p.n);
      expect(c.tp.mean).toBeCloseTo(p.tp.mean!, 10);
      expect(c.tp.ci95[0]).toBeCloseTo(p.tp.ci95[0]!, 10);
      expect(c.tp.ci95[1]).toBeCloseTo(p.tp.ci95[1]!, 10);
      expect(c.mt.mean).toBeCloseTo(p.mt.mean!, 8);
      expect(c.errorRate.mean).toBeCloseTo(p.errorRate.mean!, 12);
    });
    cli.regression.forEach((r, i) => expect(r.slope).toBeCloseTo(page.regression[i]!.slope!, 8));
    expect(cli.anova.map((a) => a.effect)).toEqual(page.anova.map((a) => a.effect));
    cli.anova.forEach((a, i) => {
      expect(a.F).toBeCloseTo(page.anova[i]!.F!, 8);
      expect(a.df2).toBe(page.anova[i]!.df2);
    });
    cli.posthoc.forEach((h, i) => expect(h.t).toBeCloseTo(page.posthoc[i]!.t!, 8));
    // cells: the same values under pseudonyms instead of codes
    const codeOf = new Map((await fetchResultsParticipants(db, studyId)).map((p) => [p.id, p.code]));
    const byCode = new Map([...pseudonyms].map(([id, ps]) => [ps, codeOf.get(id)!]));
    for (const c of cli.cells) {
      const mine = page.cells.find((x) => x.participant === byCode.get(c.participant) && x.condition === c.condition)!;
      expect(c.tp).toBeCloseTo(mine.tp, 10);
    }
  });

  it("analyze --archive replays the archive's streams with its configurations and calibration: the same path accuracy as the server, and the same statistics", async () => {
    const { path, files } = await buildArchive("replay", { pseudonyms: "random", includeStreams: true, includeDates: false, includeFreeText: false });
    for (const f of ["configurations.json", "calibration.csv", "paths.csv"]) expect(files.has(f), f).toBe(true);
    const cli = JSON.parse(execFileSync("npx", ["tsx", "--no-warnings", "experiments/cli/analyze.ts", "--archive", path, "--json"], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 })) as {
      archive: { pathSource: string; pathProblems: unknown[] };
      conditions: { condition: string; path?: { tre: number; mdc: number; mv: number; movements: number } }[];
      anova: { effect: string; F: number }[];
    };
    expect(cli.archive).toEqual({ pathSource: "streams", pathProblems: [] });
    // The server's means per condition, as conditions.csv carries them.
    const rows = parse(files.get("conditions.csv")!.toString("utf8"), { columns: true }) as Record<string, string>[];
    for (const c of cli.conditions) {
      const row = rows.find((r) => r.condition === c.condition)!;
      expect(c.path!.movements).toBe(Number(row.path_movements));
      expect(c.path!.tre).toBeCloseTo(Number(row.path_tre), 9);
      expect(c.path!.mdc).toBeCloseTo(Number(row.path_mdc), 9);
      expect(c.path!.mv).toBeCloseTo(Number(row.path_mv), 9);
    }
    const design = (await fetchStudyDesign(db, studyId))!;
    const page = buildResultsView(design, await fetchResultsParticipants(db, studyId), await fetchStudyTrialRecords(db, studyId)).analysis!;
    cli.anova.forEach((a, i) => expect(a.F).toBeCloseTo(page.anova[i]!.F!, 8));
  });

  it("the methods text counts from the data who consented, withdrew (and asked for erasure), remained and completed", async () => {
    // The demo seeds 12 simulated participants who all completed (db/seeds/demo-finished-study.ts).
    // Here two withdraw, one of them with erasure; then another loses a whole condition to the team's
    // exclusion of each of its sequences, so it lacks a cell and must be named as left out of the tests.
    const people = (await db("participants").where({ study_id: studyId }).orderBy("id").select("id", "code")) as { id: number; code: string }[];
    const [w1, w2] = people.slice(-2);
    try {
      await db("participants").whereIn("id", [w1!.id, w2!.id]).update({ status: "withdrawn" });
      await db("participants").where({ id: w2!.id }).update({ erased_at: new Date() });
      const { files } = await buildArchive("methods-counts", { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: false });
      const methods = files.get("methods.md")!.toString();
      expect(methods).toContain("12 people consented to take part; 2 withdrew (1 of them asked for their data to be erased) and are not included. Of the 10 remaining, 10 completed the session.");
      expect(methods).toMatch(/misfires when .*\(common practice\): \d+\. In all \d+ of \d+ movements/);
      expect(methods).toContain("Every participant had a value in every condition, so all 10 entered the tests.");
      expect(methods).toContain("Huynh–Feldt");
      expect(methods).toContain("All participants ran protocol version 1.");

      const first = people[0]!;
      const runs = (await db("trials").where({ participant_id: first.id, condition_index: 0, practice: false }).distinct("block", "sequence")) as { block: number; sequence: number }[];
      expect(runs.length).toBeGreaterThan(0);
      await db("exclusions").insert(runs.map((r) => ({ study_id: studyId, participant_id: first.id, scope: "sequence", condition_index: 0, block: r.block, sequence: r.sequence, reason: "sensor rate fell below 30 Hz" })));
      const again = (await buildArchive("methods-missing", { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: false })).files.get("methods.md")!.toString();
      expect(again).toMatch(/1 participant lacked a value in some condition and was left out of the ANOVA, the post hoc tests and the Friedman test \(9 remained\): \S+ \(/);
      expect(again).toContain(`The research team excluded ${runs.length} sequences`);
    } finally {
      await db("exclusions").where({ study_id: studyId, reason: "sensor rate fell below 30 Hz" }).delete();
      await db("participants").whereIn("id", [w1!.id, w2!.id]).update({ status: "completed", erased_at: null });
    }
  });

  it("writes the file only when complete, and its SHA-256 and size are those of the bytes on disk", async () => {
    const { path, summary } = await buildArchive("hash", { pseudonyms: "random", includeStreams: true, includeDates: false, includeFreeText: false });
    const bytes = readFileSync(path);
    expect(summary.sizeBytes).toBe(bytes.length);
    expect(summary.sha256).toBe(createHash("sha256").update(bytes).digest("hex"));
  });
});

describe("export jobs run in a process of their own", () => {
  const owner = DEMO_PEOPLE.find((u) => u.role === "researcher")!;
  const ownerId = async (): Promise<number> => (await db("users").where({ email: owner.email }).first<{ id: number }>("id")).id;

  it("the job's process writes the archive, and the job records the file's SHA-256, size and k", async () => {
    const actor = { id: await ownerId(), label: owner.email };
    const jobId = await insertExportJob(db, { studyId, options: { pseudonyms: "random", includeStreams: true, includeDates: false, includeFreeText: false }, createdBy: actor.id });
    await startExportProcess(db, jobId, actor);
    const job = (await fetchExportJob(db, jobId))!;
    expect(job.status, job.error ?? "").toBe("done");
    const file = (await fetchExportFile(db, jobId))!;
    const bytes = readFileSync(file.path!);
    expect(job.sizeBytes).toBe(bytes.length);
    expect(job.sha256).toBe(createHash("sha256").update(bytes).digest("hex"));
    expect((await readZip(file.path!)).has("trials.csv")).toBe(true);
    rmSync(file.path!);
  }, 60_000);

  it("a process that dies (here: out of memory under an 8 MB heap) leaves the job failed, saying so, and audit-logged", async () => {
    const actor = { id: await ownerId(), label: owner.email };
    const jobId = await insertExportJob(db, { studyId, options: { pseudonyms: "random", includeStreams: false, includeDates: false, includeFreeText: false }, createdBy: actor.id });
    await startExportProcess(db, jobId, actor, 8);
    const job = (await fetchExportJob(db, jobId))!;
    expect(job.status).toBe("failed");
    expect(job.error).toMatch(/the export process stopped/);
    const audit = await db("audit_log").where({ action: "export.fail", study_id: studyId }).orderBy("id", "desc").first<{ details: unknown }>("details");
    expect(JSON.stringify(audit?.details)).toContain(`"exportId":${jobId}`);
  }, 60_000);
});
