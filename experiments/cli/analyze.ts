// analyze: reads a trial table (CSV) and prints the analysis; see docs/analysis.md.
import { once } from "node:events";
import { basename } from "node:path";
import { parseArgs } from "node:util";
import { z } from "zod";
import { analyzeTrialFile, EXCLUSION_RULES } from "../../lib/analysis";
import { analyzeArchive } from "../../lib/export/analyzeArchive";
import { FLAG_COLUMNS, TrialTableError } from "../../lib/trials";
import { formatReport } from "./formatReport";
import { jsonPieces } from "./writeJson";

/**
 * The JSON result and a line end, written in pieces (jsonPieces: the same bytes as JSON.stringify),
 * each after the previous one has drained, so a slow reader of a pipe never makes us hold the whole text.
 */
async function printJson(value: unknown): Promise<void> {
  for (const piece of jsonPieces(value)) {
    if (!process.stdout.write(piece)) await once(process.stdout, "drain");
  }
  process.stdout.write("\n");
}

const usage =
  "usage: analyze FILE.csv | --archive FILE.zip [--json] [--start actual|nominal] [--exclude misfire|mt3sd|misfire+mt3sd|none] [--drop-flagged timed_out,recentered,clutched] [--unit px|mm|deg] [--geometry plane|sphere] [--anova tp,mt,errorRate] [--legacy]";

const argsSchema = z.object({
  file: z.string().min(1),
  archive: z.boolean(),
  json: z.boolean(),
  legacy: z.boolean(),
  start: z.enum(["actual", "nominal"]),
  exclude: z.enum(EXCLUSION_RULES),
  dropFlagged: z.array(z.enum(FLAG_COLUMNS)),
  unit: z.enum(["px", "mm", "deg"]),
  geometry: z.enum(["plane", "sphere"]),
  anova: z.array(z.enum(["tp", "mt", "errorRate"])),
});

async function main(argv: string[]): Promise<number> {
  let args: z.infer<typeof argsSchema>;
  try {
    const { values, positionals } = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        json: { type: "boolean", default: false },
        legacy: { type: "boolean", default: false },
        start: { type: "string", default: "actual" },
        exclude: { type: "string", default: "misfire" },
        "drop-flagged": { type: "string", default: "" },
        unit: { type: "string", default: "px" },
        geometry: { type: "string", default: "plane" },
        anova: { type: "string", default: "tp" },
        archive: { type: "string" },
      },
    });
    const { "drop-flagged": dropFlagged, archive, ...rest } = values;
    if (archive !== undefined ? positionals.length !== 0 : positionals.length !== 1) throw new Error("expected exactly one FILE.csv, or --archive FILE.zip");
    args = argsSchema.parse({ ...rest, archive: archive !== undefined, dropFlagged: dropFlagged.split(",").filter(Boolean), anova: values.anova.split(",").filter(Boolean), file: archive ?? positionals[0] });
    if (args.geometry === "sphere" && args.unit !== "deg") throw new Error("--geometry sphere needs --unit deg (view directions in degrees)");
  } catch (err) {
    const detail = err instanceof z.ZodError ? err.issues.map((i) => `--${String(i.path[0] ?? "").replace(/[A-Z]/g, (c) => "-" + c.toLowerCase())}: ${i.message}`).join("; ") : (err as Error).message;
    process.stderr.write(`analyze: ${detail}\n${usage}\n`);
    return 2;
  }
  try {
    if (args.archive) {
      // The archive says its unit and geometry (configurations.json); the exclusion choices are ours.
      const { result, pathSource, pathProblems } = await analyzeArchive(args.file, { start: args.start, exclude: args.exclude, dropFlagged: args.dropFlagged, anova: args.anova });
      const out = { ...result, archive: { pathSource, pathProblems } };
      if (args.json) await printJson(out);
      else process.stdout.write(formatReport(result, basename(args.file)));
      return 0;
    }
    const result = await analyzeTrialFile(args.file, {
      file: args.file,
      start: args.start,
      exclude: args.exclude,
      dropFlagged: args.dropFlagged,
      unit: args.unit,
      geometry: args.geometry,
      anova: args.anova,
      legacy: args.legacy,
    });
    if (args.json) await printJson(result);
    else process.stdout.write(formatReport(result, basename(args.file)));
    return 0;
  } catch (err) {
    if (err instanceof TrialTableError) {
      process.stderr.write(err.message.replace(/\r?\n/g, " ") + "\n");
      return 2;
    }
    throw err;
  }
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (err: unknown) => {
    process.stderr.write(`analyze: internal error: ${(err as Error).stack ?? String(err)}\n`);
    process.exitCode = 1;
  },
);
