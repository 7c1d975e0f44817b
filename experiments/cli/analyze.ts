// analyze: reads a trial table (CSV) and prints the analysis; see docs/analysis.md.
import { basename } from "node:path";
import { parseArgs } from "node:util";
import { z } from "zod";
import { analyzeTrialFile } from "../../lib/analysis";
import { TrialTableError } from "../../lib/trials";
import { formatReport } from "./formatReport";

const usage = "usage: analyze FILE.csv [--json] [--start actual|nominal] [--exclude misfire|none] [--unit px|mm|deg] [--anova tp,mt,errorRate] [--legacy]";

const argsSchema = z.object({
  file: z.string().min(1),
  json: z.boolean(),
  legacy: z.boolean(),
  start: z.enum(["actual", "nominal"]),
  exclude: z.enum(["misfire", "none"]),
  unit: z.enum(["px", "mm", "deg"]),
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
        unit: { type: "string", default: "px" },
        anova: { type: "string", default: "tp" },
      },
    });
    if (positionals.length !== 1) throw new Error("expected exactly one FILE.csv");
    args = argsSchema.parse({ ...values, anova: values.anova.split(",").filter(Boolean), file: positionals[0] });
  } catch (err) {
    const detail = err instanceof z.ZodError ? err.issues.map((i) => `--${i.path.join(".")}: ${i.message}`).join("; ") : (err as Error).message;
    process.stderr.write(`analyze: ${detail}\n${usage}\n`);
    return 2;
  }
  try {
    const result = await analyzeTrialFile(args.file, {
      file: args.file,
      start: args.start,
      exclude: args.exclude,
      unit: args.unit,
      anova: args.anova,
      legacy: args.legacy,
    });
    process.stdout.write(args.json ? JSON.stringify(result) + "\n" : formatReport(result, basename(args.file)));
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
