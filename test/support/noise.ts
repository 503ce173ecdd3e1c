// Deterministic pseudo-random numbers for invented test data (never Math.random): mulberry32, a small
// public-domain 32-bit generator, and the Box–Muller transform for normal deviates.

/** A generator of uniform numbers in [0, 1) from a 32-bit seed. */
export function uniformGenerator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A generator of standard normal deviates (Box–Muller) from a 32-bit seed. */
export function normalGenerator(seed: number): () => number {
  const u = uniformGenerator(seed);
  return () => {
    const u1 = 1 - u(); // in (0, 1], so the logarithm is finite
    const u2 = u();
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  };
}
