import { MovementStore } from "../movementStore";
import { TrialAccumulator } from "../trialAccumulator";
import type { AnalysisOptions } from "../options";
import type { ChunkData } from "./chunkTypes";

/** An accumulator's contents as plain data for postMessage (the columns trimmed to length). */
export function toChunkData(acc: TrialAccumulator): ChunkData {
  const m = acc.movements;
  const n = m.length;
  return {
    sequences: acc.sequences,
    participants: [...acc.participants],
    factorOrder: acc.factorOrder,
    length: n,
    columns: {
      seq: m.seq.slice(0, n), trial: m.trial.slice(0, n), line: m.line.slice(0, n), dx: m.dx.slice(0, n), distance: m.distance.slice(0, n),
      endError: m.endError.slice(0, n), timeMs: m.timeMs.slice(0, n), hit: m.hit.slice(0, n), flags: m.flags.slice(0, n),
    },
  };
}

/** Rebuilds an accumulator from a chunk's data, its lines shifted by `lineOffset`. */
export function fromChunkData(data: ChunkData, options: Pick<AnalysisOptions, "start" | "file" | "geometry">, lineOffset: number): TrialAccumulator {
  const acc = new TrialAccumulator(options);
  for (const s of data.sequences) acc.sequences.push({ ...s, firstLine: s.firstLine + lineOffset });
  for (const [code, g] of data.participants) acc.participants.set(code, { groups: g.groups, line: g.line + lineOffset });
  acc.factorOrder = data.factorOrder;
  const store = new MovementStore(Math.max(1, data.length));
  Object.assign(store, data.columns, { length: data.length });
  if (lineOffset !== 0) for (let i = 0; i < data.length; i++) store.line[i]! += lineOffset;
  (acc as { movements: MovementStore }).movements = store;
  return acc;
}
