import { absoluteBolometricMagnitude } from '../bolometric';
import { BC_SHIFT_TO_IAU_2015_MAG, bolometricFluxFromV } from '../bolometric-correction';
import { colourTemperature } from '../colour-temperature';
import type { ConstantSymbol } from '../constants';
import { nonDetectionWarnings } from '../detection';
import { radialVelocity } from '../doppler';
import { PhysicsError, type PhysicsWarning } from '../errors';
import { DEFAULT_R_V } from '../extinction';
import { inverseVarianceMean, type Measured } from '../measured';
import { distanceFromLuminosity, luminosityFromFlux } from '../inverse-square';
import { luminosityClass, radiusPlausibilityWarnings } from '../luminosity-class';
import { assumedClassLuminosity, LUMINOSITY_CLASS_LABELS, LUMINOSITY_CLASSES, photometricDistance } from '../main-sequence';
import { DEFAULT_MONTE_CARLO_SAMPLES, type MonteCarloResult } from '../monte-carlo';
import { parallaxDistance } from '../parallax';
import { QUANTITY_IDS, QUANTITY_SI_UNIT, type MeasurementKind, type QuantityId } from '../quantities';
import { seedFor } from '../random';
import { rotationVelocity } from '../rotation';
import { spectralClass } from '../spectral-class';
import { radiusFromLuminosity } from '../stefan-boltzmann';
import { wienTemperature } from '../wien';
import { magneticField } from '../zeeman';
import type {
  DerivationGraph,
  DerivationIssue,
  DerivedResult,
  DeriveOptions,
  MeasurementId,
  MeasurementInput,
  Propagation,
  ResolvedOptions,
} from './types';
import { validateMeasurements, type ValidMeasurement } from './validate';

/** How the adopted temperature's method names its estimates. */
const ESTIMATE_WORDS = { temperature_wien: 'Wien', temperature_colour: 'colour', temperature_planck: 'Planck-fit' } as const;

/** "a", "a and b", "a, b and c". */
function wordList(words: readonly string[]): string {
  return words.length < 2 ? words.join('') : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/** Above this share of rejected Monte Carlo draws a result says so. */
const REJECTED_DRAWS_LIMIT = 0.01;
/** Estimates further apart than this many combined sigma are flagged. */
const DISAGREEMENT_SIGMA = 3;

function resolveOptions(options: DeriveOptions): ResolvedOptions {
  const assumedClass = options.assumedClass && (LUMINOSITY_CLASSES as readonly string[]).includes(options.assumedClass) ? options.assumedClass : 'main_sequence';
  const rV = typeof options.rV === 'number' && Number.isFinite(options.rV) && options.rV > 0 ? options.rV : DEFAULT_R_V;
  const samples =
    typeof options.monteCarloSamples === 'number' && Number.isFinite(options.monteCarloSamples) && options.monteCarloSamples >= 50
      ? Math.floor(options.monteCarloSamples)
      : DEFAULT_MONTE_CARLO_SAMPLES;
  const seed = typeof options.seed === 'number' && Number.isFinite(options.seed) ? options.seed >>> 0 : 1;
  return { assumedClass, rV, monteCarloSamples: samples, seed };
}

/** A combined measured input: value, the ids it came from and cautions. */
interface Source {
  readonly value: Measured;
  readonly ids: MeasurementId[];
  readonly warnings: PhysicsWarning[];
}

/** Up to this many ids, a scan of the list found so far is cheaper than a Set. */
const SCAN_IDS_UP_TO = 32;

function uniqueIds(lists: MeasurementId[][]): MeasurementId[] {
  let total = 0;
  for (const list of lists) total += list.length;
  const out: MeasurementId[] = [];
  const seen = total > SCAN_IDS_UP_TO ? new Set<MeasurementId>() : null;
  for (const list of lists) {
    for (const id of list) {
      if (seen ? seen.has(id) : out.includes(id)) continue;
      seen?.add(id);
      out.push(id);
    }
  }
  return out;
}

function missingUncertaintyWarnings(measurements: readonly ValidMeasurement[], quantity: QuantityId): PhysicsWarning[] {
  return measurements
    .filter((m) => m.sigma === 0)
    .map((m) => ({
      code: 'uncertainty_missing' as const,
      quantity,
      message: `measurement ${String(m.id)} (${m.kind}) has no uncertainty; the σ of ${quantity} leaves it out`,
      limit: 'uncertainty > 0',
    }));
}

function disagreementWarnings(
  quantity: QuantityId,
  what: string,
  names: readonly string[],
  estimates: readonly Measured[],
  pairs: ReadonlyArray<readonly [number, number]>,
  code: 'measurements_disagree' | 'temperatures_disagree',
): PhysicsWarning[] {
  return pairs.map(([i, j]) => {
    const a = estimates[i];
    const b = estimates[j];
    const n = Math.abs(a.value - b.value) / Math.hypot(a.sigma, b.sigma);
    return {
      code,
      quantity,
      message: `${what}: ${names[i]} and ${names[j]} differ by ${n.toFixed(1)} σ (more than ${DISAGREEMENT_SIGMA} σ)`,
      limit: `${DISAGREEMENT_SIGMA} σ`,
    };
  });
}

/**
 * Combines repeated measurements of one kind by inverse-variance weighting.
 * A combination that cannot be formed becomes an issue, never a throw.
 */
function combineMeasurements(list: readonly ValidMeasurement[], quantity: QuantityId, what: string, issues: DerivationIssue[]): Source | null {
  if (list.length === 0) return null;
  const estimates = list.map((m) => ({ value: m.value, sigma: m.sigma }));
  const ids = list.map((m) => m.id);
  const warnings = missingUncertaintyWarnings(list, quantity);
  if (list.length === 1) return { value: estimates[0], ids, warnings };
  try {
    const combination = inverseVarianceMean(estimates, quantity, DISAGREEMENT_SIGMA);
    warnings.push(
      ...disagreementWarnings(
        quantity,
        what,
        list.map((m) => `measurement ${String(m.id)}`),
        estimates,
        combination.discordantPairs,
        'measurements_disagree',
      ),
    );
    return { value: combination.mean, ids, warnings };
  } catch (error) {
    if (!(error instanceof PhysicsError)) throw error;
    issues.push({ quantity, code: error.code, message: `${what} cannot be combined: ${error.message}`, ...(error.limit ? { limit: error.limit } : {}) });
    return null;
  }
}

function monteCarloWarnings(result: MonteCarloResult, quantity: QuantityId): PhysicsWarning[] {
  const total = result.accepted + result.rejected;
  const share = result.rejected / total;
  if (share <= REJECTED_DRAWS_LIMIT) return [];
  return [
    {
      code: 'monte_carlo_rejected',
      quantity,
      message: `${(share * 100).toFixed(1)} % of the Monte Carlo draws for ${quantity} fell outside the model's domain and were left out; σ describes the rest`,
      limit: `${REJECTED_DRAWS_LIMIT * 100} % of draws`,
    },
  ];
}

interface NodeSpec {
  value: number;
  uncertainty: number;
  label?: string;
  interval?: { low: number; high: number };
  method: { id: string; label: string };
  propagation: Propagation;
  ids?: MeasurementId[];
  dependsOn?: QuantityId[];
  checkedAgainst?: QuantityId[];
  constants?: ConstantSymbol[];
  warnings?: PhysicsWarning[];
}

/**
 * Derives everything a target's measurements allow. Never throws on bad
 * measurements: a refused measurement or a quantity that cannot be computed
 * becomes an entry of `issues` naming the quantity, the code and the limit.
 * @see PRODUCT.md "Derivations"; each quantity's own module for its source
 */
export function deriveAll(measurements: readonly MeasurementInput[], options: DeriveOptions = {}): DerivationGraph {
  const opts = resolveOptions(options);
  const results: Partial<Record<QuantityId, DerivedResult>> = {};
  const { valid, issues } = validateMeasurements(measurements);
  const mcOptions = (quantity: QuantityId) => ({ samples: opts.monteCarloSamples, seed: seedFor(opts.seed, quantity) });

  // One pass sorts the measurements by kind; a quantity then reads its own (in their order).
  const ofKind = new Map<MeasurementKind, ValidMeasurement[]>();
  for (const m of valid) {
    const list = ofKind.get(m.kind);
    if (list) list.push(m);
    else ofKind.set(m.kind, [m]);
  }
  const byKind = (kind: MeasurementKind, band?: string): ValidMeasurement[] => {
    const list = ofKind.get(kind) ?? [];
    return band === undefined ? [...list] : list.filter((m) => m.band === band);
  };
  const used = new Set<ValidMeasurement>();
  const use = (list: ValidMeasurement[]): ValidMeasurement[] => {
    for (const m of list) used.add(m);
    return list;
  };

  const record = (quantity: QuantityId, spec: NodeSpec): DerivedResult => {
    const dependsOn = spec.dependsOn ?? [];
    const lists = [spec.ids ?? []];
    for (const q of dependsOn) lists.push(results[q]?.inputs ?? []);
    const inputs = uniqueIds(lists);
    const result: DerivedResult = {
      quantity,
      value: spec.value,
      uncertainty: spec.uncertainty,
      unit: QUANTITY_SI_UNIT[quantity],
      method: spec.method,
      propagation: spec.propagation,
      inputs,
      dependsOn,
      checkedAgainst: spec.checkedAgainst ?? [],
      constants: spec.constants ?? [],
      warnings: spec.warnings ?? [],
    };
    if (spec.label !== undefined) result.label = spec.label;
    if (spec.interval !== undefined) result.interval = spec.interval;
    if (!Number.isFinite(result.value) || !Number.isFinite(result.uncertainty) || result.uncertainty < 0) {
      throw new PhysicsError('out_of_range', quantity, `${quantity} came out as a non-finite number from these inputs`, 'finite result');
    }
    results[quantity] = result;
    return result;
  };

  const attempt = (quantity: QuantityId, compute: () => void, measurementId?: MeasurementId): void => {
    try {
      compute();
    } catch (error) {
      if (!(error instanceof PhysicsError)) throw error;
      const issue: DerivationIssue = { quantity, code: error.code, message: error.message };
      if (error.limit !== undefined) issue.limit = error.limit;
      if (measurementId !== undefined) issue.measurementId = measurementId;
      issues.push(issue);
    }
  };

  const mcResult = (quantity: QuantityId, mc: MonteCarloResult) => ({
    value: mc.value,
    uncertainty: mc.sigma,
    interval: { low: mc.low, high: mc.high },
    warnings: monteCarloWarnings(mc, quantity),
  });

  // Shared input: E(B−V), used by the colour temperature and by the flux from V.
  const extinctionList = byKind('extinction');
  const extinctionSource = combineMeasurements(extinctionList, 'temperature_colour', 'E(B−V) measurements', issues);
  const extinctionWarnings = (quantity: QuantityId): PhysicsWarning[] => {
    if (!extinctionSource) {
      return [
        {
          code: 'extinction_assumed_zero',
          quantity,
          message: `no E(B−V) measured: ${quantity} assumes no interstellar reddening`,
          limit: 'E(B−V) = 0',
        },
      ];
    }
    // Disagreement warnings name measurements, not the quantity, so they carry over as they are.
    const out: PhysicsWarning[] = [
      ...missingUncertaintyWarnings(extinctionList, quantity),
      ...extinctionSource.warnings.filter((w) => w.code !== 'uncertainty_missing').map((w) => ({ ...w, quantity })),
    ];
    if (extinctionSource.value.value < 0) {
      out.push({
        code: 'extinction_negative',
        quantity,
        message: `E(B−V) = ${extinctionSource.value.value.toFixed(3)} mag is negative, which no dust produces; it is used as measured`,
        limit: 'E(B−V) ≥ 0',
      });
    }
    return out;
  };

  const vMagnitudes = byKind('magnitude', 'V');
  const bMagnitudes = byKind('magnitude', 'B');

  // temperature_wien
  const peak = combineMeasurements(use(byKind('peak_wavelength')), 'temperature_wien', 'peak wavelengths', issues);
  if (peak) {
    attempt('temperature_wien', () => {
      const t = wienTemperature(peak.value);
      record('temperature_wien', {
        value: t.value,
        uncertainty: t.sigma,
        method: { id: 'wien_displacement', label: "Wien's displacement law, T = b / λmax" },
        propagation: 'first_order',
        ids: peak.ids,
        constants: ['b'],
        warnings: peak.warnings.map((w) => ({ ...w, quantity: 'temperature_wien' })),
      });
    });
  }

  // temperature_colour
  let colour: Source | null = combineMeasurements(use(byKind('colour_index', 'B-V')), 'temperature_colour', 'B−V measurements', issues);
  let colourFromMagnitudes = false;
  if (!colour && vMagnitudes.length > 0 && bMagnitudes.length > 0) {
    const b = combineMeasurements(use(bMagnitudes), 'temperature_colour', 'B magnitudes', issues);
    const v = combineMeasurements(use([...vMagnitudes]), 'temperature_colour', 'V magnitudes', issues);
    if (b && v) {
      colour = {
        value: { value: b.value.value - v.value.value, sigma: Math.hypot(b.value.sigma, v.value.sigma) },
        ids: [...b.ids, ...v.ids],
        warnings: [...b.warnings, ...v.warnings],
      };
      colourFromMagnitudes = true;
    }
  }
  if (colour) {
    const c = colour;
    if (extinctionSource) use(extinctionList);
    attempt('temperature_colour', () => {
      const ct = colourTemperature(c.value, extinctionSource?.value, mcOptions('temperature_colour'));
      const mc = mcResult('temperature_colour', ct.temperatureK);
      record('temperature_colour', {
        value: mc.value,
        uncertainty: mc.uncertainty,
        interval: mc.interval,
        method: {
          id: 'ballesteros_2012',
          label: `Ballesteros (2012) relation on (B−V)₀ = ${ct.intrinsicColourMag.toFixed(3)} mag${colourFromMagnitudes ? ' (B − V from the two magnitudes)' : ''}; σ by Monte Carlo`,
        },
        propagation: 'monte_carlo',
        ids: uniqueIds([c.ids, extinctionSource?.ids ?? []]),
        warnings: [...c.warnings.map((w) => ({ ...w, quantity: 'temperature_colour' })), ...ct.warnings, ...extinctionWarnings('temperature_colour'), ...mc.warnings],
      });
    });
  }

  // temperature_planck
  const planck = combineMeasurements(use(byKind('planck_temperature')), 'temperature_planck', 'Planck-fit temperatures', issues);
  if (planck) {
    attempt('temperature_planck', () => {
      record('temperature_planck', {
        value: planck.value.value,
        uncertainty: planck.value.sigma,
        method: { id: 'planck_fit', label: 'least-squares Planck fit to a flux-calibrated spectrum' },
        propagation: planck.ids.length > 1 ? 'combination' : 'as_measured',
        ids: planck.ids,
        constants: ['h', 'c', 'k_B'],
        warnings: planck.warnings,
      });
    });
  }

  // temperature (adopted)
  const estimateIds = (['temperature_wien', 'temperature_colour', 'temperature_planck'] as const).filter((q) => results[q]);
  if (estimateIds.length > 0) {
    attempt('temperature', () => {
      const estimates = estimateIds.map((q) => ({ value: results[q]!.value, sigma: results[q]!.uncertainty }));
      const combination = inverseVarianceMean(estimates, 'temperature', DISAGREEMENT_SIGMA);
      const warnings = disagreementWarnings(
        'temperature',
        'temperature estimates',
        estimateIds,
        estimates,
        combination.discordantPairs,
        'temperatures_disagree',
      );
      let sigma = combination.mean.sigma;
      let note = '';
      if (combination.weighted && combination.degreesOfFreedom > 0) {
        const birge = Math.sqrt(combination.chiSquare / combination.degreesOfFreedom);
        if (birge > 1) {
          sigma *= birge;
          note = `; σ scaled by the Birge ratio ${birge.toFixed(2)} because the estimates scatter more than their errors`;
        }
      }
      if (!combination.weighted && estimateIds.length > 1) {
        warnings.push({
          code: 'uncertainty_missing',
          quantity: 'temperature',
          message: 'an estimate has no uncertainty, so the adopted temperature is the plain mean and its σ the standard error of the mean',
          limit: 'uncertainty > 0',
        });
      }
      record('temperature', {
        value: combination.mean.value,
        uncertainty: sigma,
        method: {
          id: 'inverse_variance_mean',
          label:
            estimateIds.length === 1
              ? `the only estimate, the ${ESTIMATE_WORDS[estimateIds[0]]} temperature`
              : `${combination.weighted ? 'inverse-variance mean' : 'mean'} of the ${wordList(estimateIds.map((q) => ESTIMATE_WORDS[q]))} temperatures${note}`,
        },
        propagation: 'combination',
        dependsOn: [...estimateIds],
        warnings,
      });
    });
  }
  const temperature = results.temperature ? { value: results.temperature.value, sigma: results.temperature.uncertainty } : null;

  // spectral_class
  if (temperature) {
    attempt('spectral_class', () => {
      const cls = spectralClass(temperature);
      record('spectral_class', {
        value: cls.index,
        uncertainty: cls.indexSigma,
        label: cls.label,
        method: {
          id: 'dwarf_sequence_log_t',
          label: `nearest type in the mean dwarf sequence (Pecaut & Mamajek 2013), interpolated in log T; matches ${cls.dwarfType}; temperature alone gives no luminosity class`,
        },
        propagation: 'first_order',
        dependsOn: ['temperature'],
      });
    });
  }

  // bolometric_flux
  const measuredFlux = combineMeasurements(use(byKind('bolometric_flux')), 'bolometric_flux', 'bolometric fluxes', issues);
  if (measuredFlux) {
    attempt('bolometric_flux', () => {
      record('bolometric_flux', {
        value: measuredFlux.value.value,
        uncertainty: measuredFlux.value.sigma,
        method: { id: 'measured', label: 'measured bolometric flux' },
        propagation: measuredFlux.ids.length > 1 ? 'combination' : 'as_measured',
        ids: measuredFlux.ids,
        warnings: measuredFlux.warnings,
      });
    });
  } else if (vMagnitudes.length > 0 && temperature) {
    const v = combineMeasurements(use([...vMagnitudes]), 'bolometric_flux', 'V magnitudes', issues);
    if (extinctionSource) use(extinctionList);
    if (v) {
      attempt('bolometric_flux', () => {
        const flux = bolometricFluxFromV(v.value, temperature, extinctionSource?.value, opts.rV, mcOptions('bolometric_flux'));
        const mc = mcResult('bolometric_flux', flux.fluxWm2);
        record('bolometric_flux', {
          value: mc.value,
          uncertainty: mc.uncertainty,
          interval: mc.interval,
          method: {
            id: 'v_magnitude_bc_flower_torres',
            label: `V − A_V (R_V = ${opts.rV}) + BC_V(T) (Flower 1996, Torres 2010) + ${BC_SHIFT_TO_IAU_2015_MAG.toFixed(3)} mag to the IAU 2015 scale, flux from the IAU 2015 B2 zero point; σ by Monte Carlo`,
          },
          propagation: 'monte_carlo',
          ids: uniqueIds([v.ids, extinctionSource?.ids ?? []]),
          dependsOn: ['temperature'],
          constants: ['f_0', 'L_0', 'L_sun'],
          warnings: [...v.warnings, ...extinctionWarnings('bolometric_flux'), ...mc.warnings],
        });
      });
    }
  }
  const flux = results.bolometric_flux ? { value: results.bolometric_flux.value, sigma: results.bolometric_flux.uncertainty } : null;

  // distance_parallax
  const parallax = combineMeasurements(use(byKind('parallax')), 'distance_parallax', 'parallaxes', issues);
  if (parallax) {
    attempt('distance_parallax', () => {
      const d = parallaxDistance(parallax.value);
      record('distance_parallax', {
        value: d.distanceM.value,
        uncertainty: d.distanceM.sigma,
        method: { id: 'parallax_inverse', label: 'd = 1 / p (1 pc = 648 000/π au)' },
        propagation: 'first_order',
        ids: parallax.ids,
        constants: ['au', 'pc'],
        warnings: [...parallax.warnings, ...d.warnings],
      });
    });
  }
  const distance = results.distance_parallax ? { value: results.distance_parallax.value, sigma: results.distance_parallax.uncertainty } : null;

  // Distance and luminosity known from elsewhere (a cluster or catalogue distance, a standard candle's luminosity).
  const givenDistanceList = byKind('distance');
  const givenDistance = combineMeasurements(givenDistanceList, 'luminosity', 'given distances', issues);
  const givenLuminosityList = byKind('luminosity');
  const givenLuminosity = combineMeasurements(givenLuminosityList, 'luminosity', 'given luminosities', issues);

  // luminosity: from the flux and the parallax distance, else a given distance; else the given luminosity.
  if (flux && (distance || givenDistance)) {
    const d = distance ?? givenDistance!.value;
    if (!distance) use(givenDistanceList);
    attempt('luminosity', () => {
      const l = luminosityFromFlux(flux, d);
      record('luminosity', {
        value: l.value,
        uncertainty: l.sigma,
        method: { id: 'inverse_square', label: `inverse-square law, L = 4π d² F, with the ${distance ? 'parallax' : 'given'} distance` },
        propagation: 'first_order',
        ids: distance ? [] : givenDistance!.ids,
        dependsOn: distance ? ['bolometric_flux', 'distance_parallax'] : ['bolometric_flux'],
        warnings: distance ? [] : givenDistance!.warnings,
      });
    });
  } else if (givenLuminosity) {
    use(givenLuminosityList);
    attempt('luminosity', () => {
      record('luminosity', {
        value: givenLuminosity.value.value,
        uncertainty: givenLuminosity.value.sigma,
        method: { id: 'given', label: 'given luminosity (known from elsewhere), used as entered' },
        propagation: givenLuminosity.ids.length > 1 ? 'combination' : 'as_measured',
        ids: givenLuminosity.ids,
        warnings: givenLuminosity.warnings,
      });
    });
  }
  const luminosity = results.luminosity ? { value: results.luminosity.value, sigma: results.luminosity.uncertainty } : null;

  // radius
  if (luminosity && temperature) {
    attempt('radius', () => {
      const r = radiusFromLuminosity(luminosity, temperature);
      record('radius', {
        value: r.value,
        uncertainty: r.sigma,
        method: { id: 'stefan_boltzmann', label: 'Stefan–Boltzmann law, R = √(L / 4πσT⁴)' },
        propagation: 'first_order',
        dependsOn: ['luminosity', 'temperature'],
        constants: ['sigma'],
        warnings: radiusPlausibilityWarnings(r.value, temperature.value, opts.assumedClass),
      });
    });
  }

  // luminosity_class
  if (luminosity && temperature) {
    attempt('luminosity_class', () => {
      const cls = luminosityClass(temperature, luminosity);
      record('luminosity_class', {
        value: cls.offset.value,
        uncertainty: cls.offset.sigma,
        label: cls.label,
        method: {
          id: 'main_sequence_offset',
          label: `offset log(L / L_MS(T)) from the mean dwarf sequence and radius ${cls.radiusRsun.toPrecision(3)} R☉; thresholds are common practice`,
        },
        propagation: 'first_order',
        dependsOn: ['temperature', 'luminosity'],
        constants: ['L_sun', 'R_sun', 'sigma'],
      });
    });
  }

  // luminosity_hr
  if (temperature) {
    attempt('luminosity_hr', () => {
      const mc = mcResult('luminosity_hr', assumedClassLuminosity(temperature, opts.assumedClass, mcOptions('luminosity_hr')));
      const warnings = [...mc.warnings];
      const derived = results.luminosity_class;
      const checkedAgainst: QuantityId[] = [];
      if (derived) {
        checkedAgainst.push('luminosity_class');
        if (derived.label !== LUMINOSITY_CLASS_LABELS[opts.assumedClass]) {
          warnings.push({
            code: 'assumed_class',
            quantity: 'luminosity_hr',
            message: `the assumed class ${LUMINOSITY_CLASS_LABELS[opts.assumedClass]} differs from the class the parallax luminosity gives, ${derived.label ?? ''}`,
            limit: LUMINOSITY_CLASS_LABELS[opts.assumedClass],
          });
        }
      }
      record('luminosity_hr', {
        value: mc.value,
        uncertainty: mc.uncertainty,
        interval: mc.interval,
        method: {
          id: 'assumed_class_luminosity',
          label: `luminosity of a ${LUMINOSITY_CLASS_LABELS[opts.assumedClass]} star at this temperature (dwarf sequence, Pecaut & Mamajek 2013; class offsets are common practice); σ by Monte Carlo including the class's spread`,
        },
        propagation: 'monte_carlo',
        dependsOn: ['temperature'],
        checkedAgainst,
        constants: ['L_sun', 'R_sun', 'sigma'],
        warnings,
      });
    });
  }

  // distance_photometric: from a given luminosity and the flux (inverse-square law), else from the assumed class.
  if (flux && givenLuminosity) {
    use(givenLuminosityList);
    attempt('distance_photometric', () => {
      const d = distanceFromLuminosity(givenLuminosity.value, flux);
      const warnings = [...givenLuminosity.warnings];
      const checkedAgainst: QuantityId[] = [];
      const dp = results.distance_parallax;
      if (dp) {
        checkedAgainst.push('distance_parallax');
        const n = Math.abs(d.value - dp.value) / Math.hypot(d.sigma, dp.uncertainty);
        if (n > DISAGREEMENT_SIGMA) {
          warnings.push({
            code: 'distances_disagree',
            quantity: 'distance_photometric',
            message: `the distance from the given luminosity differs from the parallax distance by ${n.toFixed(1)} σ (more than ${DISAGREEMENT_SIGMA} σ)`,
            limit: `${DISAGREEMENT_SIGMA} σ`,
          });
        }
      }
      record('distance_photometric', {
        value: d.value,
        uncertainty: d.sigma,
        method: { id: 'inverse_square_given_luminosity', label: 'd = √(L / 4πF) with the given luminosity (inverse-square law)' },
        propagation: 'first_order',
        ids: givenLuminosity.ids,
        dependsOn: ['bolometric_flux'],
        checkedAgainst,
        warnings,
      });
    });
  } else if (temperature && flux && results.luminosity_hr) {
    attempt('distance_photometric', () => {
      const mc = mcResult('distance_photometric', photometricDistance(temperature, opts.assumedClass, flux, mcOptions('distance_photometric')));
      const warnings = [...mc.warnings];
      const checkedAgainst: QuantityId[] = [];
      const dp = results.distance_parallax;
      if (dp) {
        checkedAgainst.push('distance_parallax');
        const combined = Math.hypot(mc.uncertainty, dp.uncertainty);
        const n = Math.abs(mc.value - dp.value) / combined;
        if (n > DISAGREEMENT_SIGMA) {
          warnings.push({
            code: 'distances_disagree',
            quantity: 'distance_photometric',
            message: `the photometric distance differs from the parallax distance by ${n.toFixed(1)} σ (more than ${DISAGREEMENT_SIGMA} σ); the assumed class ${LUMINOSITY_CLASS_LABELS[opts.assumedClass]} may be wrong`,
            limit: `${DISAGREEMENT_SIGMA} σ`,
          });
        }
      }
      record('distance_photometric', {
        value: mc.value,
        uncertainty: mc.uncertainty,
        interval: mc.interval,
        method: {
          id: 'inverse_square_assumed_class',
          label: `d = √(L / 4πF) with the luminosity of a ${LUMINOSITY_CLASS_LABELS[opts.assumedClass]} star (spectroscopic parallax); σ by Monte Carlo`,
        },
        propagation: 'monte_carlo',
        dependsOn: ['temperature', 'bolometric_flux', 'luminosity_hr'],
        checkedAgainst,
        constants: ['L_sun', 'R_sun', 'sigma'],
        warnings,
      });
    });
  }

  // absolute_bolometric_magnitude
  if (luminosity) {
    attempt('absolute_bolometric_magnitude', () => {
      const m = absoluteBolometricMagnitude(luminosity);
      record('absolute_bolometric_magnitude', {
        value: m.value,
        uncertainty: m.sigma,
        method: { id: 'iau_2015_b2', label: 'M_bol = −2.5 log10(L / L₀), IAU 2015 Resolution B2' },
        propagation: 'first_order',
        dependsOn: ['luminosity'],
        constants: ['L_0'],
      });
    });
  }

  // Line quantities: one estimate per line, combined by inverse-variance weighting.
  const lineQuantity = (
    quantity: QuantityId,
    kind: MeasurementKind,
    compute: (m: ValidMeasurement) => Measured,
    method: (media: Set<string>) => { id: string; label: string },
    constants: ConstantSymbol[],
  ): void => {
    const list = use(byKind(kind));
    if (list.length === 0) return;
    const estimates: Measured[] = [];
    const sources: ValidMeasurement[] = [];
    for (const m of list) {
      attempt(
        quantity,
        () => {
          estimates.push(compute(m));
          sources.push(m);
        },
        m.id,
      );
    }
    if (estimates.length === 0) return;
    attempt(quantity, () => {
      const warnings = missingUncertaintyWarnings(sources, quantity);
      let value = estimates[0];
      if (estimates.length > 1) {
        const combination = inverseVarianceMean(estimates, quantity, DISAGREEMENT_SIGMA);
        value = combination.mean;
        warnings.push(
          ...disagreementWarnings(
            quantity,
            'lines',
            sources.map((m) => `measurement ${String(m.id)}`),
            estimates,
            combination.discordantPairs,
            'measurements_disagree',
          ),
        );
      }
      warnings.push(...nonDetectionWarnings(quantity, value));
      record(quantity, {
        value: value.value,
        uncertainty: value.sigma,
        method: method(new Set(sources.map((m) => m.medium))),
        propagation: estimates.length > 1 ? 'combination' : 'first_order',
        ids: sources.map((m) => m.id),
        constants,
        warnings,
      });
    });
  };

  const mediaWords = (media: Set<string>): string =>
    media.size === 2 ? 'air wavelengths converted to vacuum (Morton 2000), vacuum ones used as given' : media.has('air') ? 'air wavelengths converted to vacuum (Morton 2000)' : 'vacuum wavelengths';

  lineQuantity(
    'radial_velocity',
    'line_wavelength',
    (m) => radialVelocity({ value: m.value, sigma: m.sigma }, { value: m.restWavelength, sigma: m.restWavelengthSigma }, m.medium),
    (media) => ({
      id: 'doppler_relativistic',
      label: `relativistic Doppler formula, ${mediaWords(media)}; positive = receding; no barycentric correction`,
    }),
    ['c'],
  );
  lineQuantity(
    'rotation_velocity',
    'limb_separation',
    (m) => rotationVelocity({ value: m.value, sigma: m.sigma }, { value: m.restWavelength, sigma: m.restWavelengthSigma }),
    () => ({ id: 'limb_doppler', label: 'v sin i = c Δλ / (2 λ₀) from the two limbs' }),
    ['c'],
  );
  lineQuantity(
    'magnetic_field',
    'zeeman_separation',
    (m) => magneticField({ value: m.value, sigma: m.sigma }, m.landeG, { value: m.restWavelength, sigma: m.restWavelengthSigma }),
    () => ({ id: 'zeeman_normal_triplet', label: 'normal Zeeman effect, Δλ = g e λ² B / (4π m_e c), Δλ of one σ component' }),
    ['e', 'm_e', 'c'],
  );

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

/**
 * The quantities whose value or warnings rest on a measurement in this
 * graph, transitively, in table order: what to re-derive when it changes.
 * @see PRODUCT.md "Derivations": a new measurement re-derives only what depends on it
 */
export function affectedQuantities(graph: DerivationGraph, measurementId: MeasurementId): QuantityId[] {
  const hit = new Set<QuantityId>();
  for (const q of QUANTITY_IDS) {
    if (graph.results[q]?.inputs.includes(measurementId)) hit.add(q);
  }
  for (const issue of graph.issues) {
    if (issue.measurementId === measurementId && issue.quantity) hit.add(issue.quantity);
  }
  let grew = true;
  while (grew) {
    grew = false;
    for (const q of QUANTITY_IDS) {
      const r = graph.results[q];
      if (!r || hit.has(q)) continue;
      if ([...r.dependsOn, ...r.checkedAgainst].some((d) => hit.has(d))) {
        hit.add(q);
        grew = true;
      }
    }
  }
  return QUANTITY_IDS.filter((q) => hit.has(q));
}
