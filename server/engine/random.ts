/**
 * A small seeded random number generator: mulberry32 (Tommy Ettinger's 32-bit generator, public
 * domain) for uniforms, Box-Muller (1958) for normals. Deterministic: the same seed gives the same
 * stream on every platform, so folds and test data are reproducible. Not for cryptography.
 */
export interface Rng {
  /** Uniform in [0, 1). */
  next(): number;
  /** Standard normal. */
  normal(): number;
  /** Uniform integer in [0, n). */
  int(n: number): number;
}

export function createRng(seed: number): Rng {
  let state = seed >>> 0;
  let spare: number | null = null;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (): number => {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    // 1 - u keeps the logarithm finite (u may be 0, never 1).
    const radius = Math.sqrt(-2 * Math.log(1 - next()));
    const angle = 2 * Math.PI * next();
    spare = radius * Math.sin(angle);
    return radius * Math.cos(angle);
  };
  return { next, normal, int: (n: number) => Math.floor(next() * n) };
}
