/** Heap for everything but the per-sequence totals (modules, one page of rows, one raw stream). */
const BASE_HEAP_MB = 128;
/** Movements per MB of heap: the analysis keeps ~0.6 KB per sequence of ~13 movements; 100 B a movement leaves twice that. */
const MOVEMENTS_PER_MB = 10_000;

/**
 * The V8 old-generation cap for an export process of `movements` movements (exportHeapLimitMb),
 * passed as `--max-old-space-size`.
 *
 * Why: an export allocates a steady stream of short-lived rows and buffers; without a cap V8 lets
 * the heap (and the raw streams' buffers waiting for it) grow well past what is live before it
 * collects, and the process's RSS follows. A cap sized to what the export keeps makes V8 collect
 * sooner; the live part grows only with the sequences' running totals.
 * Cost: O(1).
 * @throws never; a negative or non-finite count counts as 0.
 * @example exportHeapLimitMb(982_800) // 227
 */
export function exportHeapLimitMb(movements: number): number {
  const n = Number.isFinite(movements) && movements > 0 ? movements : 0;
  return BASE_HEAP_MB + Math.ceil(n / MOVEMENTS_PER_MB);
}
