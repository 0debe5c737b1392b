/**
 * An independent reference generator for tests: written here, not taken from
 * the engine (shared/physics/random.ts), so a Monte Carlo in a test checks the
 * engine against draws it did not make.
 */

/**
 * Standard normal deviates: mulberry32 uniforms (T. Ettinger, public domain,
 * 2017; from memory) through the Box–Muller transform (Box & Muller 1958,
 * Ann. Math. Stat. 29, 610), one deviate per pair for simplicity.
 */
export function normalDeviates(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}
