/**
 * A seeded source of uniform numbers in [0, 1) (seededUniform), so that random condition orders
 * can be re-created from the seed stored with the design.
 *
 * Source: mulberry32, a public-domain 32-bit generator by Tommy Ettinger (2017), from memory.
 * Cost: O(1) per number.
 * @throws never.
 * @example seededUniform(1)() // 0.6270739405881613
 */
export function seededUniform(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
