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

/** mulberry32's constant step of its 32-bit state. */
const MULBERRY_STEP = 0x6d2b79f5;

/**
 * mulberry32's output for a state, as a signed 32-bit integer (the same bits
 * as mulberry32 above returns, before it scales them into [0, 1)).
 */
function mulberryBits(a: number): number {
  let t = Math.imul(a ^ (a >>> 15), a | 1);
  t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
  return t ^ (t >>> 14);
}

/** A uniform deviate in (0, 1), never 0, from a state's 32 bits (the logarithms below need > 0). */
function openUniform(a: number): number {
  return ((mulberryBits(a) >>> 0) + 0.5) / 4294967296;
}

/** Layers of the ziggurat. */
const LAYERS = 128;
/** Magnitude bits of a ziggurat draw: 32 bits less the 7 that choose the layer and the sign bit. */
const SCALE = 2 ** 24;
/** Where the base layer's tail begins, and the area of every layer (Marsaglia & Tsang 2000, 128 layers). */
const TAIL_START = 3.442619855899;
const LAYER_AREA = 9.91256303526217e-3;

/**
 * The ziggurat's tables for 128 layers, computed once (never written after):
 * K, the accepting bound per layer in units of SCALE; W, the layer's width
 * per unit of SCALE; F, the density exp(−x²/2) at the layer's edge.
 * @see G. Marsaglia & W. W. Tsang (2000), The ziggurat method for generating random variables, J. Stat. Softw. 5(8), zigset()
 */
const ZIGGURAT = (() => {
  const k = new Float64Array(LAYERS);
  const w = new Float64Array(LAYERS);
  const f = new Float64Array(LAYERS);
  let dn = TAIL_START;
  let tn = dn;
  const q = LAYER_AREA / Math.exp(-0.5 * dn * dn);
  k[0] = (dn / q) * SCALE;
  k[1] = 0;
  w[0] = q / SCALE;
  w[LAYERS - 1] = dn / SCALE;
  f[0] = 1;
  f[LAYERS - 1] = Math.exp(-0.5 * dn * dn);
  for (let i = LAYERS - 2; i >= 1; i--) {
    dn = Math.sqrt(-2 * Math.log(LAYER_AREA / dn + Math.exp(-0.5 * dn * dn)));
    k[i + 1] = (dn / tn) * SCALE;
    tn = dn;
    f[i] = Math.exp(-0.5 * dn * dn);
    w[i] = dn / SCALE;
  }
  return { k, w, f };
})();

/**
 * Fills `out` with standard normal deviates from one seed's stream: the
 * ziggurat of Marsaglia & Tsang over mulberry32's 32-bit outputs. Each
 * output gives its low 7 bits to choose the layer and its other 25 to the
 * signed abscissa (separate bits, which avoids the correlation Doornik found
 * when the two share bits); some 1 % of draws take the wedge or tail path,
 * with fresh uniforms. A stream depends on nothing but its seed, and nothing
 * is kept between calls.
 * @see G. Marsaglia & W. W. Tsang (2000), J. Stat. Softw. 5(8), RNOR and nfix
 * @see J. A. Doornik (2005), An improved ziggurat method to generate normal random samples (from memory)
 */
export function fillStandardNormals(seed: number, out: Float64Array): void {
  const { k, w, f } = ZIGGURAT;
  let a = seed | 0;
  for (let n = 0; n < out.length; n++) {
    for (;;) {
      a = (a + MULBERRY_STEP) | 0;
      const bits = mulberryBits(a);
      const layer = bits & (LAYERS - 1);
      const j = bits >> 7;
      const x = j * w[layer];
      if ((j < 0 ? -j : j) < k[layer]) {
        out[n] = x;
        break;
      }
      if (layer === 0) {
        // The tail beyond TAIL_START, by Marsaglia's exponential rejection.
        let tx: number;
        let ty: number;
        do {
          a = (a + MULBERRY_STEP) | 0;
          tx = -Math.log(openUniform(a)) / TAIL_START;
          a = (a + MULBERRY_STEP) | 0;
          ty = -Math.log(openUniform(a));
        } while (ty + ty < tx * tx);
        out[n] = j > 0 ? TAIL_START + tx : -TAIL_START - tx;
        break;
      }
      a = (a + MULBERRY_STEP) | 0;
      if (f[layer] + openUniform(a) * (f[layer - 1] - f[layer]) < Math.exp(-0.5 * x * x)) {
        out[n] = x;
        break;
      }
    }
  }
}

/**
 * The Monte Carlo seed of one target of one project: its own stream, the
 * same at every re-run (it does not depend on the revision, so a re-run with
 * nothing new reproduces every digit and proposes nothing), and another for
 * every other target, so that the draws' noise never becomes one bias
 * shared by all stars.
 * @see seedFor
 */
export function targetSeed(projectId: number, targetId: number): number {
  return seedFor(seedFor(projectId >>> 0, 'project'), `target ${targetId}`);
}
