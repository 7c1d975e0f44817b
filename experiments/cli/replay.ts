// npm run replay -- --config FILE.json [--start X,Y] [--bounds W,H] SAMPLES.csv
// Replays a raw sensor stream through the motion engine and prints t_ms,yaw_deg,pitch_deg (view
// mode) or t_ms,x_px,y_px (cursor mode): the accumulated output from 0 at the first sample, or
// from X,Y with --start (the cursor's or view's position at the first sample, in output units;
// absolute touch positions in the stream, pointer_x/pointer_y, are in the same coordinates).
// --bounds W,H (cursor mode) keeps the cursor in the task area [0, W] × [0, H] as the runner
// does (moveShownPosition); view mode ignores it.
// Bad input: exit 2, one line on stderr naming file, line and column, nothing on stdout.
import { readFileSync } from "node:fs";
import { writeSync } from "node:fs";
import { createMotionEngine } from "../../lib/motion/engine";
import { parseTransferConfig, TransferConfigError, type TransferConfig } from "../../lib/motion/config";
import { parseSampleCsv, sampleFromTable, SampleCsvError } from "../../lib/motion/csv";
import type { MotionSample } from "../../lib/motion/sample";
import { moveShownPosition, type CursorBounds } from "../../lib/motion/shownPosition";
import { writeMillionths, writeNumberText } from "./writeMillionths";

function fail(message: string): never {
  process.stderr.write(message.replace(/\n/g, " ") + "\n");
  process.exit(2);
}

function lineOfKey(text: string, key: string): number {
  const at = text.indexOf(`"${key}"`);
  return at < 0 ? 1 : text.slice(0, at).split("\n").length;
}

function columnOfKey(text: string, key: string): number {
  const at = text.indexOf(`"${key}"`);
  if (at < 0) return 1;
  return at - text.lastIndexOf("\n", at - 1);
}

function readConfig(file: string): TransferConfig {
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch {
    fail(`${file}:1:1: cannot read file`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    const m = /position (\d+)/.exec(String((error as Error).message));
    const pos = m ? Number(m[1]) : 0;
    const before = text.slice(0, pos);
    const line = before.split("\n").length;
    fail(`${file}:${line}:${pos - before.lastIndexOf("\n")}: not valid JSON`);
  }
  try {
    return parseTransferConfig(json);
  } catch (error) {
    if (!(error instanceof TransferConfigError)) throw error;
    const first = error.issues[0] ?? "(configuration): invalid";
    const field = first.slice(0, first.indexOf(":"));
    const key = field.split(/[.,]/)[0]?.trim() ?? field;
    fail(`${file}:${lineOfKey(text, key)}:${columnOfKey(text, key)}: ${first}`);
  }
}

const USAGE = "usage: npm run replay -- --config FILE.json [--start X,Y] [--bounds W,H] SAMPLES.csv";

function parsePair(option: string, text: string | undefined): [number, number] {
  const parts = (text ?? "").split(",");
  const [x, y] = parts.map((p) => (p.trim() === "" ? NaN : Number(p)));
  if (parts.length !== 2 || !Number.isFinite(x) || !Number.isFinite(y)) fail(`replay: ${option} needs two numbers X,Y, got "${text ?? ""}" (${USAGE})`);
  return [x as number, y as number];
}

function parseStart(text: string | undefined): { x: number; y: number } {
  const [x, y] = parsePair("--start", text);
  return { x, y };
}

function parseBounds(text: string | undefined): CursorBounds {
  const [width, height] = parsePair("--bounds", text);
  if (width <= 0 || height <= 0) fail(`replay: --bounds needs a positive width and height, got "${text ?? ""}" (${USAGE})`);
  return { width, height };
}

function parseArgs(argv: string[]): { config: string; samples: string; start: { x: number; y: number }; bounds: CursorBounds | null } {
  let config: string | undefined, samples: string | undefined;
  let start = { x: 0, y: 0 };
  let bounds: CursorBounds | null = null;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === "--config") config = argv[++i];
    else if (a?.startsWith("--config=")) config = a.slice(9);
    else if (a === "--start") start = parseStart(argv[++i]);
    else if (a?.startsWith("--start=")) start = parseStart(a.slice(8));
    else if (a === "--bounds") bounds = parseBounds(argv[++i]);
    else if (a?.startsWith("--bounds=")) bounds = parseBounds(a.slice(9));
    else if (a?.startsWith("--")) fail(`replay: unknown option ${a} (${USAGE})`);
    else if (samples === undefined) samples = a;
    else fail(`replay: more than one samples file (${USAGE})`);
  }
  if (!config || !samples) fail(`replay: ${USAGE}`);
  return { config, samples, start, bounds };
}

function main(): void {
  const args = parseArgs(process.argv.slice(2));
  const config = readConfig(args.config);
  let text: string;
  try {
    text = readFileSync(args.samples, "utf8");
  } catch {
    fail(`${args.samples}:1:1: cannot read file`);
  }
  let table;
  try {
    table = parseSampleCsv(text, args.samples);
  } catch (error) {
    if (error instanceof SampleCsvError) fail(error.message);
    throw error;
  }
  const engine = createMotionEngine(config);
  engine.setPosition(args.start.x, args.start.y);
  const sample: MotionSample = { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 };
  const cursor = config.displayMode === "cursor";
  const bounds = cursor ? args.bounds : null;
  const shown = { x: args.start.x, y: args.start.y };
  // Output lines written as bytes into one 1 MB buffer (writeMillionths gives exactly the text of
  // String(Math.round(v·1e6)/1e6)), flushed whenever fewer than LINE_ROOM bytes are left.
  const out = Buffer.allocUnsafe(OUT_BYTES);
  let at = out.write(cursor ? "t_ms,x_px,y_px\n" : "t_ms,yaw_deg,pitch_deg\n", 0, "latin1");
  for (let i = 0; i < table.length; i++) {
    const step = engine.push(sampleFromTable(table, i, sample));
    if (step) moveShownPosition(shown, step, bounds, engine);
    at = writeNumberText(out, at, sample.tMs);
    out[at++] = 44;
    at = writeMillionths(out, at, shown.x);
    out[at++] = 44;
    at = writeMillionths(out, at, shown.y);
    out[at++] = 10;
    if (at > OUT_BYTES - LINE_ROOM) {
      writeAll(out, at);
      at = 0;
    }
  }
  writeAll(out, at);
}

const OUT_BYTES = 1 << 20;
/** Room for one output line: three numbers of at most ~25 characters each plus separators. */
const LINE_ROOM = 256;

/** Write out[0, end) to stdout, looping over partial writes. */
function writeAll(out: Buffer, end: number): void {
  let done = 0;
  while (done < end) done += writeSync(1, out, done, end - done);
}

main();
