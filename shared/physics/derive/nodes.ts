import { airToVacuumM } from '../air-vacuum';
import { absoluteBolometricMagnitudeMag } from '../bolometric';
import { BC_SHIFT_TO_IAU_2015_MAG, bolometricFluxFromVWm2 } from '../bolometric-correction';
import { ballesterosTemperatureK, colourTemperatureWarnings } from '../colour-temperature';
import { CONSTANTS, type ConstantSymbol } from '../constants';
import { relativisticRadialVelocityMs } from '../doppler';
import { nonDetectionWarnings } from '../detection';
import type { PhysicsWarning } from '../errors';
import { dereddenedColourMag } from '../extinction';
import { distanceFromLuminosityM, luminosityFromFluxW } from '../inverse-square';
import { classifyLuminosity, labelNamesClass, luminosityClassWithin, radiusPlausibilityWarnings } from '../luminosity-class';
import { ASSUMED_CLASS_MODELS, assumedClassLogLuminosity, LUMINOSITY_CLASS_LABELS } from '../main-sequence';
import { summariseDraws } from '../monte-carlo';
import { parallaxDistance, parallaxDistanceM } from '../parallax';
import type { MeasurementKind, QuantityId } from '../quantities';
import { rotationVelocityMs } from '../rotation';
import { spectralClassFromTemperature, spectralIndexFromTemperature } from '../spectral-class';
import { radiusFromLuminosityM } from '../stefan-boltzmann';
import { wienTemperatureK } from '../wien';
import { magneticFieldT } from '../zeeman';
import { DISAGREEMENT_SIGMA } from './combine';
import type { DerivedResult, DeriveOptions, MeasurementId, Propagation, ResolvedOptions } from './types';
import type { ValidMeasurement } from './validate';

/**
 * The derivation graph, in one place: per quantity what it needs (measurement
 * kinds, other quantities, options), how it computes (the laws of
 * shared/physics, each a plain function of numbers), its method words and
 * sources. The evaluator (evaluate.ts) runs the nodes in dependency order
 * and pushes every measurement's Monte Carlo draws through them; the
 * dependency questions (dependencies.ts) read the same table.
 */

/** A value with its Monte Carlo draws, one per draw of the raw measurements. */
export interface Series {
  /** The law at the measured values. */
  readonly value: number;
  readonly draws: Float64Array;
  /** 1-σ: a measurement's own, or half the central 68 % interval of a derived quantity's draws. */
  readonly sigma: number;
  /** Measurements it rests on directly. */
  readonly ids: readonly MeasurementId[];
  /** Cautions about the inputs (missing σ, disagreeing repeats). */
  readonly warnings: readonly PhysicsWarning[];
}

/** A law's value at the nominal inputs and at every draw. */
export interface Pushed {
  readonly value: number;
  readonly draws: Float64Array;
}

/** What a node may ask of the evaluator while it derives. */
export interface NodeContext {
  readonly options: ResolvedOptions;
  /** The valid measurements of a kind (of a band), in their order; each is marked as used. */
  measurements(kind: MeasurementKind, band?: string): ValidMeasurement[];
  /** The measurements combined by combineEstimates, with their draws; null when there are none or they cannot be combined (an issue says why). */
  combined(list: readonly ValidMeasurement[], what: string): Series | null;
  /**
   * One line's estimate: the law of its observed and rest wavelength (each
   * with its draws). Null, with an issue naming the measurement, when the
   * law refuses the line's own values.
   */
  lineEstimate(m: ValidMeasurement, law: (observed: number, rest: number) => number): Series | null;
  /** A derived quantity this node needs, or null when it was not derived. Recorded in dependsOn. */
  quantity(q: QuantityId): Series | null;
  /** A derived quantity this node is only cross-checked against. Recorded in checkedAgainst. */
  checkAgainst(q: QuantityId): DerivedResult | undefined;
  /** A model input of the node's own, drawn from a standard normal stream of its own and scaled by σ (mean 0). */
  modelDeviate(label: string, sigma: number): Series;
  /** A constant input. */
  constant(value: number): Series;
  /** A law of one, two or three numbers at the nominal inputs (a refusal there refuses the node) and at every draw (a refusal there rejects the draw). */
  push1(law: (a: number) => number, a: Series): Pushed;
  push2(law: (a: number, b: number) => number, a: Series, b: Series): Pushed;
  push3(law: (a: number, b: number, c: number) => number, a: Series, b: Series, c: Series): Pushed;
  /** Estimates of one quantity combined by combineEstimates, draw by draw. */
  combine(estimates: readonly Series[], names: readonly string[], what: string, code: 'measurements_disagree' | 'temperatures_disagree'): Pushed & { note: string; warnings: PhysicsWarning[]; weighted: boolean };
}

/** What a node gives back; σ and the interval the evaluator reads from the draws. */
export interface NodeOutcome extends Pushed {
  readonly method: { id: string; label: string };
  readonly label?: string;
  readonly propagation?: Propagation;
  /** Measurements it rests on directly (those of the quantities it needs are added). */
  readonly ids?: readonly MeasurementId[];
  readonly constants?: readonly ConstantSymbol[];
  readonly warnings?: readonly PhysicsWarning[];
  /** Warnings that need the result's own σ (cross-checks). */
  readonly afterwards?: (own: { value: number; uncertainty: number }) => PhysicsWarning[];
}

/** One row of the table. */
export interface DerivationNode {
  readonly quantity: QuantityId;
  /** Measurement kinds it reads. */
  readonly kinds: readonly MeasurementKind[];
  /** Quantities it is computed from. */
  readonly quantities: readonly QuantityId[];
  /** Quantities it is only cross-checked against (their change can change its warnings). */
  readonly checks: readonly QuantityId[];
  /** Options that change it (besides monteCarloSamples and seed, which change every σ). */
  readonly options: readonly (keyof DeriveOptions)[];
  /** Null when its inputs are absent; throws PhysicsError when they cannot give a value. */
  readonly derive: (ctx: NodeContext) => NodeOutcome | null;
}

const L_SUN_W = CONSTANTS.L_sun.value;

/** "a", "a and b", "a, b and c". */
function wordList(words: readonly string[]): string {
  return words.length < 2 ? words.join('') : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/** E(B−V) as the two reddened routes use it, with its cautions; 0 (and a warning) when none was measured. */
function colourExcess(ctx: NodeContext, quantity: QuantityId): { excess: Series; warnings: PhysicsWarning[] } {
  const excess = ctx.combined(ctx.measurements('extinction'), 'E(B−V) measurements');
  if (!excess) {
    return {
      excess: ctx.constant(0),
      warnings: [{ code: 'extinction_assumed_zero', quantity, message: `no E(B−V) measured: ${quantity} assumes no interstellar reddening`, limit: 'E(B−V) = 0' }],
    };
  }
  const warnings = [...excess.warnings];
  if (excess.value < 0) {
    warnings.push({
      code: 'extinction_negative',
      quantity,
      message: `E(B−V) = ${excess.value.toFixed(3)} mag is negative, which no dust produces; it is used as measured`,
      limit: 'E(B−V) ≥ 0',
    });
  }
  return { excess, warnings };
}

/** Words for the wavelengths' medium. */
function mediaWords(media: ReadonlySet<string>): string {
  if (media.size === 2) return 'air wavelengths converted to vacuum (Morton 2000), vacuum ones used as given';
  return media.has('air') ? 'air wavelengths converted to vacuum (Morton 2000)' : 'vacuum wavelengths';
}

/**
 * A quantity measured line by line: each line's estimate through its law,
 * then the lines combined. A line whose estimate cannot be formed is
 * refused with its own issue (thrown with its id by the evaluator's
 * per-line guard) and the rest still count.
 */
function lineNode(
  quantity: QuantityId,
  kind: MeasurementKind,
  law: (m: ValidMeasurement) => (observed: number, rest: number) => number,
  method: (media: ReadonlySet<string>) => { id: string; label: string },
  constants: readonly ConstantSymbol[],
): DerivationNode {
  return {
    quantity,
    kinds: [kind],
    quantities: [],
    checks: [],
    options: [],
    derive: (ctx) => {
      const list = ctx.measurements(kind);
      if (list.length === 0) return null;
      const estimates: Series[] = [];
      const sources: ValidMeasurement[] = [];
      for (const m of list) {
        const line = ctx.lineEstimate(m, law(m));
        if (line) {
          estimates.push(line);
          sources.push(m);
        }
      }
      if (estimates.length === 0) return null;
      const names = sources.map((m) => `measurement ${String(m.id)}`);
      const combined = ctx.combine(estimates, names, 'lines', 'measurements_disagree');
      const warnings = estimates.flatMap((e) => e.warnings);
      return {
        value: combined.value,
        draws: combined.draws,
        method: method(new Set(sources.map((m) => m.medium))),
        propagation: estimates.length > 1 ? 'combination' : 'monte_carlo',
        ids: sources.map((m) => m.id),
        constants,
        warnings: [...warnings, ...combined.warnings],
        afterwards: (own) => nonDetectionWarnings(quantity, { value: own.value, sigma: own.uncertainty }),
      };
    },
  };
}

/**
 * A law of a size (a separation, ≥ 0) for draws too: a measurement of 0 ± σ
 * has draws below 0, the measurement's own scatter, and a law proportional
 * to the size carries them over with their sign (law(−x) = −law(x)), so that
 * the draws of a non-detection stay centred on 0 instead of half refused.
 */
function oddInSize(law: (size: number, rest: number) => number): (size: number, rest: number) => number {
  return (size, rest) => (size < 0 ? -law(-size, rest) : law(size, rest));
}

/** The vacuum wavelength of a wavelength in a line's medium. */
function toVacuum(m: ValidMeasurement): (wavelengthM: number) => number {
  return m.medium === 'vacuum' ? (x) => x : airToVacuumM;
}

/**
 * The table, in an order in which every quantity comes after those it needs
 * or checks (the evaluator verifies it).
 * @see PRODUCT.md "Derivations"
 */
export const DERIVATION_NODES: readonly DerivationNode[] = Object.freeze([
  {
    quantity: 'temperature_wien',
    kinds: ['peak_wavelength'],
    quantities: [],
    checks: [],
    options: [],
    derive: (ctx) => {
      const peak = ctx.combined(ctx.measurements('peak_wavelength'), 'peak wavelengths');
      if (!peak) return null;
      const t = ctx.push1(wienTemperatureK, peak);
      return { ...t, method: { id: 'wien_displacement', label: "Wien's displacement law, T = b / λ_max" }, ids: peak.ids, constants: ['b'], warnings: peak.warnings };
    },
  },
  {
    quantity: 'temperature_colour',
    kinds: ['colour_index', 'magnitude', 'extinction'],
    quantities: [],
    checks: [],
    options: [],
    derive: (ctx) => {
      let colour = ctx.combined(ctx.measurements('colour_index', 'B-V'), 'B−V measurements');
      let fromMagnitudes = false;
      if (!colour) {
        const bList = ctx.measurements('magnitude', 'B');
        const vList = ctx.measurements('magnitude', 'V');
        if (bList.length === 0 || vList.length === 0) return null;
        const b = ctx.combined(bList, 'B magnitudes');
        const v = ctx.combined(vList, 'V magnitudes');
        if (!b || !v) return null;
        // The colour index is the difference of the two magnitudes, draw by draw.
        const bv = ctx.push2((x, y) => x - y, b, v);
        colour = { ...bv, sigma: Math.hypot(b.sigma, v.sigma), ids: [...b.ids, ...v.ids], warnings: [...b.warnings, ...v.warnings] };
        fromMagnitudes = true;
      }
      const { excess, warnings } = colourExcess(ctx, 'temperature_colour');
      const t = ctx.push2((c, e) => ballesterosTemperatureK(dereddenedColourMag(c, e)), colour, excess);
      const intrinsic = colour.value - excess.value;
      return {
        ...t,
        method: {
          id: 'ballesteros_2012',
          label: `Ballesteros (2012) relation on (B−V)₀ = ${intrinsic.toFixed(3)} mag${fromMagnitudes ? ' (B − V from the two magnitudes)' : ''}; σ by Monte Carlo`,
        },
        ids: [...colour.ids, ...excess.ids],
        warnings: [...colour.warnings, ...colourTemperatureWarnings(intrinsic), ...warnings],
      };
    },
  },
  {
    quantity: 'temperature_planck',
    kinds: ['planck_temperature'],
    quantities: [],
    checks: [],
    options: [],
    derive: (ctx) => {
      const planck = ctx.combined(ctx.measurements('planck_temperature'), 'Planck-fit temperatures');
      if (!planck) return null;
      return {
        value: planck.value,
        draws: planck.draws,
        method: { id: 'planck_fit', label: 'least-squares Planck fit to a flux-calibrated spectrum' },
        propagation: planck.ids.length > 1 ? 'combination' : 'as_measured',
        ids: planck.ids,
        constants: ['h', 'c', 'k_B'],
        warnings: planck.warnings,
      };
    },
  },
  {
    quantity: 'temperature',
    kinds: [],
    quantities: ['temperature_wien', 'temperature_colour', 'temperature_planck'],
    checks: [],
    options: [],
    derive: (ctx) => {
      const words = { temperature_wien: 'Wien', temperature_colour: 'colour', temperature_planck: 'Planck-fit' } as const;
      const names = (['temperature_wien', 'temperature_colour', 'temperature_planck'] as const).filter((q) => ctx.quantity(q));
      if (names.length === 0) return null;
      const estimates = names.map((q) => ctx.quantity(q) as Series);
      const combined = ctx.combine(estimates, names, 'temperature estimates', 'temperatures_disagree');
      const label =
        names.length === 1
          ? `the only estimate, the ${words[names[0]]} temperature`
          : `${combined.weighted ? 'inverse-variance mean' : 'mean'} of the ${wordList(names.map((q) => words[q]))} temperatures${combined.note ? `; ${combined.note}` : ''}`;
      return { value: combined.value, draws: combined.draws, method: { id: 'inverse_variance_mean', label }, propagation: 'combination', warnings: combined.warnings };
    },
  },
  {
    quantity: 'spectral_class',
    kinds: [],
    quantities: ['temperature'],
    checks: [],
    options: [],
    derive: (ctx) => {
      const t = ctx.quantity('temperature');
      if (!t) return null;
      const cls = spectralClassFromTemperature(t.value);
      const index = ctx.push1(spectralIndexFromTemperature, t);
      return {
        value: cls.index,
        draws: index.draws,
        label: cls.label,
        method: {
          id: 'dwarf_sequence_log_t',
          label: `nearest type in the mean dwarf sequence (Pecaut & Mamajek 2013), interpolated in log T; matches ${cls.dwarfType}; temperature alone gives no luminosity class`,
        },
      };
    },
  },
  {
    quantity: 'bolometric_flux',
    kinds: ['bolometric_flux', 'magnitude', 'extinction'],
    quantities: ['temperature'],
    checks: [],
    options: ['rV'],
    derive: (ctx) => {
      const measured = ctx.combined(ctx.measurements('bolometric_flux'), 'bolometric fluxes');
      if (measured) {
        return {
          value: measured.value,
          draws: measured.draws,
          method: { id: 'measured', label: 'measured bolometric flux' },
          propagation: measured.ids.length > 1 ? 'combination' : 'as_measured',
          ids: measured.ids,
          warnings: measured.warnings,
        };
      }
      const t = ctx.quantity('temperature');
      if (!t) return null;
      const vList = ctx.measurements('magnitude', 'V');
      if (vList.length === 0) return null;
      const v = ctx.combined(vList, 'V magnitudes');
      if (!v) return null;
      const { excess, warnings } = colourExcess(ctx, 'bolometric_flux');
      const rV = ctx.options.rV;
      const flux = ctx.push3((m, temperature, e) => bolometricFluxFromVWm2(m, temperature, e, rV), v, t, excess);
      return {
        ...flux,
        method: {
          id: 'v_magnitude_bc_flower_torres',
          label: `V − A_V (R_V = ${rV}) + BC_V(T) (Flower 1996, Torres 2010) + ${BC_SHIFT_TO_IAU_2015_MAG.toFixed(3)} mag to the IAU 2015 scale, flux from the IAU 2015 B2 zero point; σ by Monte Carlo`,
        },
        ids: [...v.ids, ...excess.ids],
        constants: ['f_0', 'L_0', 'L_sun'],
        warnings: [...v.warnings, ...warnings],
      };
    },
  },
  {
    quantity: 'distance_parallax',
    kinds: ['parallax'],
    quantities: [],
    checks: [],
    options: [],
    derive: (ctx) => {
      const parallax = ctx.combined(ctx.measurements('parallax'), 'parallaxes');
      if (!parallax) return null;
      const d = ctx.push1(parallaxDistanceM, parallax);
      return {
        ...d,
        method: { id: 'parallax_inverse', label: 'd = 1 / p (1 pc = 648 000/π au); σ and the interval from the parallax’s draws' },
        ids: parallax.ids,
        constants: ['au', 'pc'],
        warnings: [...parallax.warnings, ...parallaxDistance({ value: parallax.value, sigma: parallax.sigma }).warnings],
      };
    },
  },
  {
    quantity: 'luminosity',
    kinds: ['distance', 'luminosity'],
    quantities: ['bolometric_flux', 'distance_parallax'],
    checks: [],
    options: [],
    derive: (ctx) => {
      // A luminosity entered as known from elsewhere (a standard candle's) is what the team chose to use: it comes first, as entered.
      const l = ctx.combined(ctx.measurements('luminosity'), 'given luminosities');
      if (l) {
        return {
          value: l.value,
          draws: l.draws,
          method: { id: 'given', label: 'given luminosity (known from elsewhere), used as entered' },
          propagation: l.ids.length > 1 ? 'combination' : 'as_measured',
          ids: l.ids,
          warnings: l.warnings,
        };
      }
      const f = ctx.quantity('bolometric_flux');
      // A distance known from elsewhere (a cluster's, a catalogue's) stands in for the parallax only when there is none.
      const parallax = f && ctx.quantity('distance_parallax');
      const given = f && !parallax ? ctx.combined(ctx.measurements('distance'), 'given distances') : null;
      const d = parallax ?? given;
      if (!f || !d) return null;
      return {
        ...ctx.push2(luminosityFromFluxW, f, d),
        method: { id: 'inverse_square', label: `inverse-square law, L = 4π d² F, with the ${parallax ? 'parallax' : 'given'} distance` },
        ...(given ? { ids: given.ids, warnings: given.warnings } : {}),
      };
    },
  },
  {
    quantity: 'radius',
    kinds: [],
    quantities: ['luminosity', 'temperature'],
    checks: [],
    options: ['assumedClass'],
    derive: (ctx) => {
      const l = ctx.quantity('luminosity');
      const t = l && ctx.quantity('temperature');
      if (!l || !t) return null;
      const r = ctx.push2(radiusFromLuminosityM, l, t);
      return {
        ...r,
        method: { id: 'stefan_boltzmann', label: 'Stefan–Boltzmann law, R = √(L / 4πσT⁴)' },
        constants: ['sigma'],
        warnings: radiusPlausibilityWarnings(r.value, t.value, ctx.options.assumedClass),
      };
    },
  },
  {
    quantity: 'luminosity_class',
    kinds: [],
    quantities: ['temperature', 'luminosity'],
    checks: [],
    options: [],
    derive: (ctx) => {
      const t = ctx.quantity('temperature');
      const l = t && ctx.quantity('luminosity');
      if (!t || !l) return null;
      const offset = ctx.push2((temperature, luminosity) => classifyLuminosity(temperature, luminosity).offsetDex, t, l);
      // Every class within 1σ of the offset (half its draws' central 68 % interval) is named, not only the nominal one.
      const spread = summariseDraws(offset.draws, new Float64Array(offset.draws.length), 'luminosity_class');
      const cls = luminosityClassWithin(t.value, l.value, (spread.high - spread.low) / 2);
      return {
        value: cls.offsetDex,
        draws: offset.draws,
        label: cls.label,
        warnings: cls.warnings,
        method: {
          id: 'main_sequence_offset',
          label: `offset log₁₀(L / L_MS(T)) from the mean dwarf sequence and radius ${cls.radiusRsun.toPrecision(3)} R☉; thresholds are common practice`,
        },
        constants: ['L_sun', 'R_sun', 'sigma'],
      };
    },
  },
  {
    quantity: 'luminosity_hr',
    kinds: [],
    quantities: ['temperature'],
    checks: ['luminosity_class'],
    options: ['assumedClass'],
    derive: (ctx) => {
      const t = ctx.quantity('temperature');
      if (!t) return null;
      const assumed = ctx.options.assumedClass;
      // The class's intrinsic spread is a model input of its own, drawn once per draw.
      const spread = ctx.modelDeviate('assumed class spread', ASSUMED_CLASS_MODELS[assumed].scatterDex);
      const l = ctx.push2((temperature, deviation) => L_SUN_W * 10 ** assumedClassLogLuminosity(temperature, assumed, deviation), t, spread);
      const warnings: PhysicsWarning[] = [];
      const derived = ctx.checkAgainst('luminosity_class');
      if (derived && !labelNamesClass(derived.label ?? '', assumed)) {
        warnings.push({
          code: 'assumed_class',
          quantity: 'luminosity_hr',
          message: `the assumed class ${LUMINOSITY_CLASS_LABELS[assumed]} differs from the class its luminosity and temperature give, ${derived.label ?? ''}`,
          limit: LUMINOSITY_CLASS_LABELS[assumed],
        });
      }
      return {
        ...l,
        method: {
          id: 'assumed_class_luminosity',
          label: `luminosity of a ${LUMINOSITY_CLASS_LABELS[assumed]} star at this temperature (dwarf sequence, Pecaut & Mamajek 2013; class offsets are common practice); σ by Monte Carlo including the class's spread`,
        },
        constants: ['L_sun', 'R_sun', 'sigma'],
        warnings,
      };
    },
  },
  {
    quantity: 'distance_photometric',
    kinds: ['luminosity'],
    quantities: ['luminosity_hr', 'bolometric_flux'],
    checks: ['distance_parallax'],
    options: ['assumedClass'],
    derive: (ctx) => {
      const f = ctx.quantity('bolometric_flux');
      if (!f) return null;
      const assumed = ctx.options.assumedClass;
      // A luminosity known from elsewhere (a standard candle's) gives the distance by the same law, in place of the assumed class's.
      const given = ctx.combined(ctx.measurements('luminosity'), 'given luminosities');
      const l = given ?? ctx.quantity('luminosity_hr');
      if (!l) return null;
      const parallax = ctx.checkAgainst('distance_parallax');
      const what = given ? 'the distance from the given luminosity' : 'the photometric distance';
      const because = given ? '' : `; the assumed class ${LUMINOSITY_CLASS_LABELS[assumed]} may be wrong`;
      return {
        ...ctx.push2(distanceFromLuminosityM, l, f),
        method: given
          ? { id: 'inverse_square_given_luminosity', label: 'd = √(L / 4πF) with the given luminosity (inverse-square law); σ by Monte Carlo' }
          : {
              id: 'inverse_square_assumed_class',
              label: `d = √(L / 4πF) with the luminosity of a ${LUMINOSITY_CLASS_LABELS[assumed]} star (spectroscopic parallax); σ by Monte Carlo`,
            },
        ...(given ? { ids: given.ids, warnings: given.warnings } : { constants: ['L_sun', 'R_sun', 'sigma'] as ConstantSymbol[] }),
        afterwards: (own) => {
          if (!parallax) return [];
          const apart = Math.abs(own.value - parallax.value) / Math.hypot(own.uncertainty, parallax.uncertainty);
          if (!(apart > DISAGREEMENT_SIGMA)) return [];
          return [
            {
              code: 'distances_disagree',
              quantity: 'distance_photometric',
              message: `${what} differs from the parallax distance by ${apart.toFixed(1)} σ (more than ${DISAGREEMENT_SIGMA} σ)${because}`,
              limit: `${DISAGREEMENT_SIGMA} σ`,
            },
          ];
        },
      };
    },
  },
  {
    quantity: 'absolute_bolometric_magnitude',
    kinds: [],
    quantities: ['luminosity'],
    checks: [],
    options: [],
    derive: (ctx) => {
      const l = ctx.quantity('luminosity');
      if (!l) return null;
      return { ...ctx.push1(absoluteBolometricMagnitudeMag, l), method: { id: 'iau_2015_b2', label: 'M_bol = −2.5 log₁₀(L / L₀), IAU 2015 Resolution B2' }, constants: ['L_0'] };
    },
  },
  lineNode(
    'radial_velocity',
    'line_wavelength',
    (m) => {
      const vacuum = toVacuum(m);
      // An exact rest wavelength is converted once, not at every draw.
      const exactRest = m.restWavelengthSigma === 0 ? vacuum(m.restWavelength) : Number.NaN;
      return m.restWavelengthSigma === 0
        ? (observed) => relativisticRadialVelocityMs(vacuum(observed), exactRest)
        : (observed, rest) => relativisticRadialVelocityMs(vacuum(observed), vacuum(rest));
    },
    (media) => ({ id: 'doppler_relativistic', label: `relativistic Doppler formula, ${mediaWords(media)}; positive = receding; no barycentric correction` }),
    ['c'],
  ),
  lineNode(
    'rotation_velocity',
    'limb_separation',
    () => oddInSize(rotationVelocityMs),
    () => ({ id: 'limb_doppler', label: 'v sin i = c Δλ / (2 λ₀) from the two limbs' }),
    ['c'],
  ),
  lineNode(
    'magnetic_field',
    'zeeman_separation',
    (m) => oddInSize((separation, rest) => magneticFieldT(separation, m.landeG, rest)),
    () => ({ id: 'zeeman_normal_triplet', label: 'normal Zeeman effect, Δλ = g e λ² B / (4π m_e c), Δλ of one σ component' }),
    ['e', 'm_e', 'c'],
  ),
] satisfies DerivationNode[]);
