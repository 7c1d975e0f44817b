import { z } from "zod";
import { nominalIndexOfDifficulty, ringAmplitude, ringTargets, ringVisitingOrder } from "../../lib/task";
import type { TrialRow } from "../../lib/trials";
import { normalFrom, seededRandom } from "./random";

/** An invented benchmark scenario: two techniques × four CD gains, simulated participants. */
export const generatorOptionsSchema = z.object({
  participants: z.int().min(1).default(20),
  techniques: z.array(z.string().min(1)).min(1).default(["motion", "stick"]),
  gains: z.array(z.number().positive()).min(1).default([2, 4, 6, 8]),
  amplitudes: z.array(z.number().positive()).min(1).default([128, 256, 512]),
  widths: z.array(z.number().positive()).min(1).default([16, 32, 64]),
  targetsPerRing: z.int().min(3).default(13),
  blocks: z.int().min(1).default(1),
  /** Stop after this many movements (rounded up to a whole sequence). */
  maxMovements: z.int().min(1).optional(),
  seed: z.int().default(1),
  /** Probability that a selection is a slip far from the target (becomes a misfire). */
  slipRate: z.number().min(0).max(1).default(0.005),
});
export type GeneratorOptions = z.input<typeof generatorOptionsSchema>;

/**
 * Simulated trial table (science notes §9, pipeline consistency only): per movement the end point
 * is drawn around the target with SD σ = W/4.133 along the axis (so the expected We is W), the time
 * from MT = a + b·log2(A/W + 1) with noise; b depends on technique and gain. Loops run block →
 * A×W → participant → condition, so truncating keeps every participant × condition cell.
 *
 * Cost: O(movements), O(1) memory (a generator).
 * @throws ZodError on bad options.
 */
export function* generateTrialRows(options: GeneratorOptions = {}): Generator<TrialRow> {
  const o = generatorOptionsSchema.parse(options);
  const uniform = seededRandom(o.seed);
  const normal = normalFrom(uniform);
  const n = o.targetsPerRing % 2 === 1 ? o.targetsPerRing : o.targetsPerRing + 1;
  const order = ringVisitingOrder(n);
  const participantSkill = Array.from({ length: o.participants }, () => 1 + 0.15 * normal());
  let emitted = 0;
  const round = (v: number) => Math.round(v * 100) / 100;
  for (let block = 1; block <= o.blocks; block++) {
    let sequence = 0;
    for (const amplitude of o.amplitudes) {
      for (const width of o.widths) {
        sequence++;
        const diameter = amplitude / Math.cos(Math.PI / (2 * n));
        const targets = ringTargets(n, diameter, { x: 600, y: 400 });
        const id = nominalIndexOfDifficulty(ringAmplitude(n, diameter), width);
        for (let p = 0; p < o.participants; p++) {
          for (const technique of o.techniques) {
            for (const gain of o.gains) {
              if (o.maxMovements !== undefined && emitted >= o.maxMovements) return;
              const slope = (technique === o.techniques[0] ? 170 : 290) * (1 + Math.abs(gain - 5) / 10) * participantSkill[p]!;
              const sigma = width / 4.133;
              const first = targets[order[0]!]!;
              let start = { x: round(first.x), y: round(first.y) };
              for (let k = 1; k <= n; k++) {
                const from = targets[order[k - 1]!]!;
                const to = targets[order[k]!]!;
                const ax = to.x - from.x;
                const ay = to.y - from.y;
                const len = Math.hypot(ax, ay);
                const slip = uniform() < o.slipRate;
                const along = slip ? -0.8 * len : sigma * normal();
                const across = sigma * normal();
                const end = { x: round(to.x + (along * ax - across * ay) / len), y: round(to.y + (along * ay + across * ax) / len) };
                const timeMs = Math.max(50, 150 + slope * id + 60 * normal());
                yield {
                  participant: `P${String(p + 1).padStart(2, "0")}`,
                  condition: `${technique}-${gain}`,
                  block,
                  sequence,
                  trial: k,
                  amplitude: round(ringAmplitude(n, diameter)),
                  width,
                  fromX: round(from.x),
                  fromY: round(from.y),
                  toX: round(to.x),
                  toY: round(to.y),
                  startX: start.x,
                  startY: start.y,
                  endX: end.x,
                  endY: end.y,
                  timeMs: Math.round(timeMs * 10) / 10,
                  hit: Math.hypot(end.x - to.x, end.y - to.y) <= width / 2,
                  factors: { technique, gain: String(gain) },
                };
                emitted++;
                start = end;
              }
            }
          }
        }
      }
    }
  }
}
