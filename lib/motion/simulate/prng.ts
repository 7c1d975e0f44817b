/** A seeded source of uniform [0, 1) and standard normal numbers. */
export interface SeededRandom {
  uniform(): number;
  normal(): number;
}

/**
 * Seeded pseudo-random numbers (createSeededRandom).
 *
 * Purpose: reproducible simulated participants. Uniforms from mulberry32 (a small public-domain
 * 32-bit generator by Tommy Ettinger, 2017); normals by the Box–Muller transform (Box & Muller,
 * Ann. Math. Statist. 29:610, 1958). Cost: O(1) per number.
 * @throws never.
 * @example createSeededRandom(1).uniform() // 0.6270739405881613
 */
export function createSeededRandom(seed: number): SeededRandom {
  let a = seed >>> 0;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  let spare: number | null = null;
  const normal = (): number => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u = 0;
    while (u === 0) u = uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
  return { uniform, normal };
}
