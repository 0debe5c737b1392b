import { PhysicsError, type PhysicsWarning } from '../errors';
import { DEFAULT_R_V } from '../extinction';
import { physicalLimitWarnings } from '../limits';
import { LUMINOSITY_CLASSES } from '../main-sequence';
import { DEFAULT_MONTE_CARLO_SAMPLES, summariseDraws } from '../monte-carlo';
import { QUANTITY_IDS, QUANTITY_SI_UNIT, type MeasurementKind, type QuantityId } from '../quantities';
import { fillStandardNormals, seedFor } from '../random';
import { combineDraws, combineEstimates } from './combine';
import { DERIVATION_NODES, type DerivationNode, type NodeContext, type NodeOutcome, type Pushed, type Series } from './nodes';
import type { DerivationGraph, DerivationIssue, DerivedResult, DeriveOptions, MeasurementId, MeasurementInput, ResolvedOptions } from './types';
import { validateMeasurements, type ValidMeasurement } from './validate';

/** Above this share of rejected Monte Carlo draws a result says so. */
const REJECTED_DRAWS_LIMIT = 0.01;

/**
 * The interval is reported when its two arms, value − low and high − value,
 * differ by more than this share of their sum. At 1000 draws each end of
 * the interval scatters by about 0.05 σ, the difference of the arms by some
 * 0.07 σ, 0.035 of their sum: 0.1 is three times that, so a reported
 * asymmetry is the law's and not the draws' noise.
 */
export const ASYMMETRY_LIMIT = 0.1;

/** The fewest draws the engine takes (below it the 68 % interval is not read). */
const MIN_SAMPLES = 50;

/**
 * Readings of one spectrum move together: one deviate per spectrum and
 * draw, with this sign per kind, so that a hotter Planck fit goes with a
 * bluer continuum peak (T = b / λmax). Taking the two as fully correlated
 * is the cautious choice: their mean is then no more precise than its
 * parts, where treating them as independent would count one spectrum twice.
 */
const SPECTRUM_DEVIATE_SIGN: Partial<Record<MeasurementKind, number>> = Object.freeze({ peak_wavelength: -1, planck_temperature: 1 });

function resolveOptions(options: DeriveOptions): ResolvedOptions {
  const assumedClass = options.assumedClass && (LUMINOSITY_CLASSES as readonly string[]).includes(options.assumedClass) ? options.assumedClass : 'main_sequence';
  const rV = typeof options.rV === 'number' && Number.isFinite(options.rV) && options.rV > 0 ? options.rV : DEFAULT_R_V;
  const samples =
    typeof options.monteCarloSamples === 'number' && Number.isFinite(options.monteCarloSamples) && options.monteCarloSamples >= MIN_SAMPLES
      ? Math.floor(options.monteCarloSamples)
      : DEFAULT_MONTE_CARLO_SAMPLES;
  const seed = typeof options.seed === 'number' && Number.isFinite(options.seed) ? options.seed >>> 0 : 1;
  return { assumedClass, rV, monteCarloSamples: samples, seed };
}

/** The nodes in an order where each follows what it needs and checks; throws on a cycle or an unknown quantity. */
function dependencyOrder(nodes: readonly DerivationNode[]): DerivationNode[] {
  const byQuantity = new Map(nodes.map((n) => [n.quantity, n]));
  const done = new Set<QuantityId>();
  const out: DerivationNode[] = [];
  const visit = (node: DerivationNode, path: QuantityId[]): void => {
    if (done.has(node.quantity)) return;
    if (path.includes(node.quantity)) throw new Error(`derivation table has a cycle: ${[...path, node.quantity].join(' → ')}`);
    for (const q of [...node.quantities, ...node.checks]) {
      const before = byQuantity.get(q);
      if (!before) throw new Error(`derivation table: ${node.quantity} needs ${q}, which has no node`);
      visit(before, [...path, node.quantity]);
    }
    done.add(node.quantity);
    out.push(node);
  };
  for (const node of nodes) visit(node, []);
  return out;
}

/** The table in evaluation order, checked once when the module loads. */
const ORDERED_NODES = dependencyOrder(DERIVATION_NODES);
if (new Set(DERIVATION_NODES.map((n) => n.quantity)).size !== QUANTITY_IDS.length || !QUANTITY_IDS.every((q) => DERIVATION_NODES.some((n) => n.quantity === q))) {
  throw new Error('derivation table must have exactly one node per quantity');
}

function missingUncertaintyWarnings(measurements: readonly ValidMeasurement[], what: string): PhysicsWarning[] {
  return measurements
    .filter((m) => m.sigma === 0)
    .map((m) => ({
      code: 'uncertainty_missing' as const,
      quantity: what,
      message: `measurement ${String(m.id)} (${m.kind}) has no uncertainty; the σ leaves it out`,
      limit: 'uncertainty > 0',
    }));
}

function uniqueIds(lists: readonly (readonly MeasurementId[])[]): MeasurementId[] {
  const seen = new Set<MeasurementId>();
  const out: MeasurementId[] = [];
  for (const list of lists) {
    for (const id of list) {
      if (seen.has(id)) continue;
      seen.add(id);
      out.push(id);
    }
  }
  return out;
}

/** out[s] = law(a[s]) for every draw; a refused draw (a PhysicsError, or a NaN input) becomes NaN. */
function pushDraws1(law: (a: number) => number, a: Float64Array, out: Float64Array): void {
  const n = out.length;
  let s = 0;
  while (s < n) {
    try {
      for (; s < n; s++) {
        const x = a[s];
        out[s] = x === x ? law(x) : Number.NaN;
      }
    } catch (error) {
      if (!(error instanceof PhysicsError)) throw error;
      out[s++] = Number.NaN;
    }
  }
}

function pushDraws2(law: (a: number, b: number) => number, a: Float64Array, b: Float64Array, out: Float64Array): void {
  const n = out.length;
  let s = 0;
  while (s < n) {
    try {
      for (; s < n; s++) {
        const x = a[s];
        const y = b[s];
        out[s] = x === x && y === y ? law(x, y) : Number.NaN;
      }
    } catch (error) {
      if (!(error instanceof PhysicsError)) throw error;
      out[s++] = Number.NaN;
    }
  }
}

function pushDraws3(law: (a: number, b: number, c: number) => number, a: Float64Array, b: Float64Array, c: Float64Array, out: Float64Array): void {
  const n = out.length;
  let s = 0;
  while (s < n) {
    try {
      for (; s < n; s++) {
        const x = a[s];
        const y = b[s];
        const z = c[s];
        out[s] = x === x && y === y && z === z ? law(x, y, z) : Number.NaN;
      }
    } catch (error) {
      if (!(error instanceof PhysicsError)) throw error;
      out[s++] = Number.NaN;
    }
  }
}

/** Draw arrays handed out this many to one underlying buffer. */
const ARRAYS_PER_BUFFER = 12;

/**
 * A source of zeroed arrays of `samples` draws, cut from buffers of
 * ARRAYS_PER_BUFFER arrays each: the data of one derivation sit side by side
 * and are freed together with it.
 */
function drawArrays(samples: number): () => Float64Array {
  let buffer = new Float64Array(0);
  let next = 0;
  return () => {
    if (next === buffer.length) {
      buffer = new Float64Array(samples * ARRAYS_PER_BUFFER);
      next = 0;
    }
    const out = buffer.subarray(next, next + samples);
    next += samples;
    return out;
  };
}

/** A law's value at the nominal inputs, refused when it is not a finite number. */
function nominal(value: number, quantity: string): number {
  if (!Number.isFinite(value)) {
    throw new PhysicsError('out_of_range', quantity, `${quantity} cannot be computed from these inputs (the result is not a finite number)`, 'finite result');
  }
  return value;
}

function issueOf(error: PhysicsError, quantity: QuantityId, measurementId?: MeasurementId): DerivationIssue {
  const issue: DerivationIssue = { quantity, code: error.code, message: error.message };
  if (error.limit !== undefined) issue.limit = error.limit;
  if (measurementId !== undefined) issue.measurementId = measurementId;
  return issue;
}

/**
 * Derives everything a target's measurements allow, by the table of
 * DERIVATION_NODES. Every measurement is drawn `monteCarloSamples` times
 * from its own seeded stream (the target's seed and the measurement's id;
 * readings of one spectrum share one), and the draws pass through every
 * node, so that a measurement feeding two branches (the temperature and
 * E(B−V) in both the flux and the temperature; one spectrum's peak and
 * Planck fit) stays correlated with itself. A value is its law at the
 * measured values; its σ is half the central 68.27 % interval of its draws,
 * and the interval is given where it is asymmetric. Never throws on bad
 * measurements: a refused measurement or a quantity that cannot be computed
 * becomes an issue naming the quantity, the code and the limit.
 * @see PRODUCT.md "Derivations"; JCGM 101:2008 (GUM Supplement 1), propagation of distributions
 */
export function evaluate(measurements: readonly MeasurementInput[], options: DeriveOptions = {}): DerivationGraph {
  const opts = resolveOptions(options);
  const samples = opts.monteCarloSamples;
  const { valid, issues } = validateMeasurements(measurements);
  const results: Partial<Record<QuantityId, DerivedResult>> = {};
  const series = new Map<QuantityId, Series>();
  // One buffer holds a run of draw arrays, so that a star's thirty-odd arrays cost a few allocations, not thirty.
  const take = drawArrays(samples);
  const scratch = take();

  const ofKind = new Map<MeasurementKind, ValidMeasurement[]>();
  for (const m of valid) {
    const list = ofKind.get(m.kind);
    if (list) list.push(m);
    else ofKind.set(m.kind, [m]);
  }
  const used = new Set<ValidMeasurement>();

  const normals = (label: string): Float64Array => {
    const out = take();
    fillStandardNormals(seedFor(opts.seed, label), out);
    return out;
  };
  const spectrumNormals = new Map<MeasurementId, Float64Array>();
  const rawSeries = new Map<ValidMeasurement, Series>();
  const raw = (m: ValidMeasurement): Series => {
    const known = rawSeries.get(m);
    if (known) return known;
    const draws = take();
    if (m.sigma > 0) {
      const sign = m.spectrumId !== undefined ? SPECTRUM_DEVIATE_SIGN[m.kind] : undefined;
      let z: Float64Array;
      if (sign !== undefined && m.spectrumId !== undefined) {
        z = spectrumNormals.get(m.spectrumId) ?? normals(`spectrum ${String(m.spectrumId)}`);
        spectrumNormals.set(m.spectrumId, z);
      } else {
        // A measurement of its own: its deviates are drawn straight into its array.
        z = draws;
        fillStandardNormals(seedFor(opts.seed, `measurement ${String(m.id)}`), z);
      }
      const value = m.value;
      const scale = (sign ?? 1) * m.sigma;
      for (let s = 0; s < samples; s++) draws[s] = value + scale * z[s];
    } else {
      draws.fill(m.value);
    }
    const out: Series = { value: m.value, draws, sigma: m.sigma, ids: [m.id], warnings: missingUncertaintyWarnings([m], m.kind) };
    rawSeries.set(m, out);
    return out;
  };
  const constant = (value: number): Series => ({ value, draws: take().fill(value), sigma: 0, ids: [], warnings: [] });
  const summary = (draws: Float64Array, quantity: string) => summariseDraws(draws, scratch, quantity);
  /** A series whose σ is read from its draws only when a combination asks for it (most are never combined). */
  const drawnSeries = (value: number, draws: Float64Array, ids: readonly MeasurementId[], warnings: readonly PhysicsWarning[], quantity: string): Series => {
    let sigma: number | undefined;
    return {
      value,
      draws,
      ids,
      warnings,
      get sigma() {
        if (sigma === undefined) {
          const s = summary(draws, quantity);
          sigma = (s.high - s.low) / 2;
        }
        return sigma;
      },
    };
  };

  const combineSeries = (
    estimates: readonly Series[],
    names: readonly string[],
    what: string,
    quantity: string,
    code: 'measurements_disagree' | 'temperatures_disagree',
  ) => {
    // One estimate is its own combination; its σ is not asked for (reading it costs a selection).
    if (estimates.length === 1) return { value: estimates[0].value, draws: estimates[0].draws, note: '', warnings: [], weighted: true };
    const combined = combineEstimates(
      estimates.map((e) => ({ value: e.value, sigma: e.sigma })),
      names,
      what,
      quantity,
      code,
    );
    const draws = take();
    const extra = combined.standardError > 0 ? normals(`mean of ${quantity} ${what} ${names.join(' ')}`) : null;
    combineDraws(
      combined,
      estimates.map((e) => e.draws),
      extra,
      draws,
    );
    return { value: nominal(combined.value, quantity), draws, note: combined.note, warnings: combined.warnings, weighted: combined.weighted };
  };

  const combinedCache = new Map<string, Series | null>();

  for (const node of ORDERED_NODES) {
    const quantity = node.quantity;
    const dependsOn: QuantityId[] = [];
    const checkedAgainst: QuantityId[] = [];
    const push = (draws: Float64Array, value: number): Pushed => ({ value: nominal(value, quantity), draws });
    const ctx: NodeContext = {
      options: opts,
      measurements: (kind, band) => {
        if (!node.kinds.includes(kind)) throw new Error(`derivation table: ${quantity} reads ${kind} but does not list it`);
        const all = ofKind.get(kind) ?? [];
        const list = band === undefined ? [...all] : all.filter((m) => m.band === band);
        for (const m of list) used.add(m);
        return list;
      },
      combined: (list, what) => {
        if (list.length === 0) return null;
        const key = `${what}|${list.map((m) => String(m.id)).join('|')}`;
        if (combinedCache.has(key)) return combinedCache.get(key) ?? null;
        let out: Series | null = null;
        try {
          const parts = list.map(raw);
          if (parts.length === 1) out = parts[0];
          else {
            const c = combineSeries(
              parts,
              list.map((m) => `measurement ${String(m.id)}`),
              what,
              quantity,
              'measurements_disagree',
            );
            out = drawnSeries(c.value, c.draws, list.map((m) => m.id), [...missingUncertaintyWarnings(list, quantity), ...c.warnings], quantity);
          }
        } catch (error) {
          if (!(error instanceof PhysicsError)) throw error;
          issues.push({ quantity, code: error.code, message: `${what} cannot be combined: ${error.message}`, ...(error.limit ? { limit: error.limit } : {}) });
        }
        combinedCache.set(key, out);
        return out;
      },
      lineEstimate: (m, law) => {
        try {
          const observed = raw(m);
          const restDraws = take();
          if (m.restWavelengthSigma > 0) {
            const z = normals(`rest wavelength ${String(m.id)}`);
            for (let s = 0; s < samples; s++) restDraws[s] = m.restWavelength + m.restWavelengthSigma * z[s];
          } else restDraws.fill(m.restWavelength);
          const value = nominal(law(m.value, m.restWavelength), quantity);
          const draws = take();
          pushDraws2(law, observed.draws, restDraws, draws);
          return drawnSeries(value, draws, [m.id], observed.warnings, quantity);
        } catch (error) {
          if (!(error instanceof PhysicsError)) throw error;
          issues.push(issueOf(error, quantity, m.id));
          return null;
        }
      },
      quantity: (q) => {
        if (!node.quantities.includes(q)) throw new Error(`derivation table: ${quantity} reads ${q} but does not list it`);
        const s = series.get(q) ?? null;
        if (s && !dependsOn.includes(q)) dependsOn.push(q);
        return s;
      },
      checkAgainst: (q) => {
        if (!node.checks.includes(q)) throw new Error(`derivation table: ${quantity} checks ${q} but does not list it`);
        const r = results[q];
        if (r && !checkedAgainst.includes(q)) checkedAgainst.push(q);
        return r;
      },
      modelDeviate: (label, sigma) => {
        const z = normals(`${quantity} ${label}`);
        for (let s = 0; s < samples; s++) z[s] *= sigma;
        return { value: 0, draws: z, sigma, ids: [], warnings: [] };
      },
      constant,
      push1: (law, a) => {
        const draws = take();
        const value = law(a.value);
        pushDraws1(law, a.draws, draws);
        return push(draws, value);
      },
      push2: (law, a, b) => {
        const draws = take();
        const value = law(a.value, b.value);
        pushDraws2(law, a.draws, b.draws, draws);
        return push(draws, value);
      },
      push3: (law, a, b, c) => {
        const draws = take();
        const value = law(a.value, b.value, c.value);
        pushDraws3(law, a.draws, b.draws, c.draws, draws);
        return push(draws, value);
      },
      combine: (estimates, names, what, code) => combineSeries(estimates, names, what, quantity, code),
    };

    let outcome: NodeOutcome | null;
    try {
      outcome = node.derive(ctx);
      if (!outcome) continue;
      const s = summary(outcome.draws, quantity);
      const uncertainty = (s.high - s.low) / 2;
      const value = nominal(outcome.value, quantity);
      if (!Number.isFinite(uncertainty)) nominal(uncertainty, quantity);
      // A value that breaks physics is refused here (an issue); one outside the known stars is warned.
      const warnings: PhysicsWarning[] = [...(outcome.warnings ?? []), ...physicalLimitWarnings(quantity, value)];
      const share = s.rejected / (s.accepted + s.rejected);
      if (share > REJECTED_DRAWS_LIMIT) {
        warnings.push({
          code: 'monte_carlo_rejected',
          quantity,
          message: `${(share * 100).toFixed(1)} % of the Monte Carlo draws for ${quantity} fell outside the model's domain and were left out; σ describes the rest`,
          limit: `${REJECTED_DRAWS_LIMIT * 100} % of draws`,
        });
      }
      if (outcome.afterwards) warnings.push(...outcome.afterwards({ value, uncertainty }));
      const inputs = uniqueIds([outcome.ids ?? [], ...dependsOn.map((q) => results[q]?.inputs ?? [])]);
      const result: DerivedResult = {
        quantity,
        value,
        uncertainty,
        unit: QUANTITY_SI_UNIT[quantity],
        method: outcome.method,
        propagation: outcome.propagation ?? 'monte_carlo',
        inputs,
        dependsOn,
        checkedAgainst,
        constants: [...(outcome.constants ?? [])],
        warnings: warnings.map((w) => (w.quantity === quantity ? w : { ...w, quantity })),
      };
      if (outcome.label !== undefined) result.label = outcome.label;
      const up = s.high - value;
      const down = value - s.low;
      if (Math.abs(up - down) > ASYMMETRY_LIMIT * (up + down) || up < 0 || down < 0) result.interval = { low: s.low, high: s.high };
      results[quantity] = result;
      series.set(quantity, { value, draws: outcome.draws, sigma: uncertainty, ids: inputs, warnings: [] });
    } catch (error) {
      if (!(error instanceof PhysicsError)) throw error;
      issues.push(issueOf(error, quantity));
    }
  }

  for (const m of valid) {
    if (!used.has(m)) {
      issues.push({
        quantity: null,
        measurementId: m.id,
        code: 'measurement_unused',
        message: `measurement ${String(m.id)} (${m.kind}${m.band ? ` ${m.band}` : ''}) is not used by any derivation`,
      });
    }
  }
  return { results, issues, options: opts };
}
