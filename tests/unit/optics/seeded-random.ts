/**
 * A small seeded generator (mulberry32, Tommy Ettinger's public-domain 32-bit PRNG, from memory) so the
 * "random" films and noise in these tests are the same on every run.
 */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A uniform number in [low, high). */
export function uniform(random: () => number, low: number, high: number): number {
  return low + (high - low) * random();
}
