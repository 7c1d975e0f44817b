import { createWriteStream } from "node:fs";
import { once } from "node:events";
import { formatTrialRow, trialCsvHeader } from "../../lib/trials";
import { generateTrialRows, type GeneratorOptions } from "./generateTrialRows";

/**
 * Writes a simulated trial table to `path` as CSV, streaming. Returns the number of movements.
 *
 * Cost: O(movements); O(1) memory.
 * @throws ZodError on bad options; the write stream's error on I/O failure.
 */
export async function writeTrialTable(path: string, options: GeneratorOptions = {}): Promise<number> {
  const out = createWriteStream(path);
  const factors = ["gain", "technique"];
  out.write(trialCsvHeader(factors) + "\n");
  let count = 0;
  let buffer: string[] = [];
  for (const row of generateTrialRows(options)) {
    buffer.push(formatTrialRow(row, factors));
    count++;
    if (buffer.length === 5000) {
      if (!out.write(buffer.join("\n") + "\n")) await once(out, "drain");
      buffer = [];
    }
  }
  if (buffer.length > 0) out.write(buffer.join("\n") + "\n");
  out.end();
  await once(out, "finish");
  return count;
}
