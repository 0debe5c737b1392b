/**
 * A small seeded pseudo-random source, so that a Monte Carlo uncertainty is
 * the same number on the server and in the browser, today and at the next
 * re-derivation.
 */

/** A source of uniform deviates in [0, 1). */
export type Uniform = () => number;

/**
 * mulberry32: a 32-bit-state generator, fast and good enough for error
 * propagation (not for cryptography).
 * @see T. Ettinger, mulberry32 (public-domain generator, 2017; from memory)
 */
export function mulberry32(seed: number): Uniform {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Standard normal deviates by the Box–Muller transform; each pair of uniforms
 * gives two deviates, the second kept for the next call.
 * @see G. E. P. Box & M. E. Muller (1958), Ann. Math. Stat. 29, 610
 */
export function gaussian(uniform: Uniform): () => number {
  let spare = 0;
  let hasSpare = false;
  return () => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    // 1 − u keeps the logarithm's argument in (0, 1].
    const u = 1 - uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    const theta = 2 * Math.PI * v;
    spare = r * Math.sin(theta);
    hasSpare = true;
    return r * Math.cos(theta);
  };
}

/**
 * Streams already drawn, by seed. A stream's deviates depend on nothing but
 * its seed, and the engine seeds each quantity from the base seed and the
 * quantity's name, so every target derived with the same base seed draws the
 * very same deviates: a commit that re-derives thousands of targets computes
 * each stream once instead of once per target. Bounded, because a caller
 * that seeds each target differently (the benchmark does) never hits it.
 */
const STREAMS = new Map<number, Float64Array>();
const MAX_STREAMS = 32;

/**
 * The first `count` deviates of gaussian(mulberry32(seed)), exactly the
 * numbers that generator gives in that order (Box–Muller on mulberry32, the
 * two written out inline because two closure calls per uniform cost as much
 * as the logarithm). The array is shared: read it, never write to it, and
 * not after the next call, which may reuse it for another stream.
 * @see G. E. P. Box & M. E. Muller (1958), Ann. Math. Stat. 29, 610; mulberry32 above
 */
export function standardNormals(seed: number, count: number): Float64Array {
  const key = seed >>> 0;
  const cached = STREAMS.get(key);
  if (cached && cached.length >= count) return cached;
  // Whole pairs, so a longer request later needs no leftover state.
  const length = count + (count & 1);
  let out: Float64Array | undefined;
  if (!cached && STREAMS.size >= MAX_STREAMS) {
    // The oldest stream makes room; its array is reused when of the same
    // length, which spares the collector when every target has a seed of its own.
    const oldest = STREAMS.keys().next().value as number;
    const spare = STREAMS.get(oldest) as Float64Array;
    STREAMS.delete(oldest);
    if (spare.length === length) out = spare;
  }
  out ??= new Float64Array(length);
  let a = key;
  for (let i = 0; i < length; i += 2) {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    const u = 1 - ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    a = (a + 0x6d2b79f5) >>> 0;
    t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    const v = ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    const r = Math.sqrt(-2 * Math.log(u));
    const theta = 2 * Math.PI * v;
    out[i] = r * Math.cos(theta);
    out[i + 1] = r * Math.sin(theta);
  }
  STREAMS.set(key, out);
  return out;
}

/**
 * Mixes a base seed with a label (FNV-1a over the label's UTF-16 code units),
 * so each derivation draws its own stream and adding one measurement never
 * shifts another quantity's Monte Carlo numbers.
 * @see Fowler–Noll–Vo hash, FNV-1a 32-bit (from memory)
 */
export function seedFor(baseSeed: number, label: string): number {
  let h = (0x811c9dc5 ^ (baseSeed >>> 0)) >>> 0;
  for (let i = 0; i < label.length; i++) {
    h ^= label.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h >>> 0;
}
