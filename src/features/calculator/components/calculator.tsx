import { useDeferredValue, useMemo, useState } from 'react';
import { airToVacuumM } from '@shared/physics/air-vacuum';
import { deriveAll, type DerivationIssue } from '@shared/physics/derive';
import { readableMessage } from '@shared/physics/display';
import { LUMINOSITY_CLASS_LABELS, LUMINOSITY_CLASSES, type LuminosityClassName } from '@shared/physics/main-sequence';
import type { QuantityId } from '@shared/physics/quantities';
import { STRONG_LINES } from '@shared/physics/tables/strong-lines';
import { ALLOWED_UNITS, UNITS } from '@shared/physics/units';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { FieldGroup } from '@/components/ui/field';
import { PageHeader } from '@/components/ui/page-header';
import { QUANTITY_SECTIONS, type QuantitySection } from '@/lib/quantity-sections';
import {
  emptyForm,
  readForm,
  type CalculatorForm,
  type DistanceUnit,
  type FieldId,
  type FluxUnit,
  type LuminosityUnit,
  type Medium,
  type WavelengthUnit,
} from './calculator-inputs';
import { LedgerLine } from './ledger-line';
import { MeasuredField, selectClasses, UnitSelect } from './measured-field';
import { nanometres, RestWavelengthField } from './rest-wavelength-field';
import { Notation } from '@/components/ui/notation';

const WAVELENGTH_UNITS: ReadonlyArray<{ value: WavelengthUnit; label: string }> = [
  { value: 'nm', label: 'nm' },
  { value: 'angstrom', label: 'Å' },
  { value: 'um', label: 'µm' },
];
/** The units a file may give (ALLOWED_UNITS), by their symbols; metres are left to files. */
const DISTANCE_UNITS: ReadonlyArray<{ value: DistanceUnit; label: string }> = ALLOWED_UNITS.distance.filter((u) => u !== 'm').map((u) => ({ value: u, label: UNITS[u].symbol }));
const LUMINOSITY_UNITS: ReadonlyArray<{ value: LuminosityUnit; label: string }> = ALLOWED_UNITS.luminosity.map((u) => ({ value: u, label: UNITS[u].symbol }));
const FLUX_UNITS: ReadonlyArray<{ value: FluxUnit; label: string }> = [
  { value: 'W/m2', label: 'W m⁻²' },
  { value: 'erg/s/cm2', label: 'erg s⁻¹ cm⁻²' },
];

/** What a quantity still needs, said when it has no value yet. */
const NEEDS: Readonly<Record<QuantityId, string>> = {
  temperature_wien: 'a continuum peak wavelength',
  temperature_colour: 'a B−V colour',
  temperature_planck: 'a Planck-fit temperature',
  temperature: 'at least one temperature estimate',
  spectral_class: 'a temperature',
  bolometric_flux: 'a bolometric flux, or V with a temperature',
  distance_parallax: 'a parallax',
  luminosity: 'a bolometric flux and a parallax or a given distance, or a given luminosity',
  radius: 'a luminosity and a temperature',
  luminosity_class: 'a luminosity and a temperature',
  luminosity_hr: 'a temperature',
  distance_photometric: 'a bolometric flux with a temperature or a given luminosity',
  absolute_bolometric_magnitude: 'a luminosity',
  radial_velocity: 'an observed wavelength and the line’s rest wavelength',
  rotation_velocity: 'the limb-to-limb separation of a line',
  magnetic_field: 'a Zeeman shift and the line’s Landé g',
};

/*
 * Here the peak wavelength is whatever was typed, often read off a plot, so
 * the temperatures come with Wien's law's limits spelled out.
 */
const SECTIONS: readonly QuantitySection[] = QUANTITY_SECTIONS.map((section) =>
  section.quantities.includes('temperature_wien')
    ? {
        ...section,
        note: 'Wien’s law on a real spectrum is rough: absorption lines, the instrument’s response and reddening move the apparent peak; prefer a Planck fit to a flux-calibrated spectrum or the colour temperature. Temperature alone gives no luminosity class: giants and dwarfs of one temperature differ in luminosity by orders of magnitude.',
      }
    : section,
);

/** How the page names each measurement when the engine's texts refer to it by id. */
const FIELD_LABELS: Readonly<Record<FieldId, string>> = {
  peak: 'the peak wavelength',
  planck: 'the Planck-fit temperature',
  bv: 'B−V',
  ebv: 'E(B−V)',
  v: 'V',
  flux: 'the bolometric flux',
  parallax: 'the parallax',
  distance: 'the given distance',
  luminosity: 'the given luminosity',
  line: 'the observed wavelength',
  limb: 'the limb separation',
  zeeman: 'the Zeeman shift',
  rV: 'R_V',
};

/** Engine texts in the page's words: measurement ids become field names, quantity ids become names. */
function wording(text: string): string {
  const named = text.replace(/measurement (\w+)(?: \([a-z_]+(?: [^)]*)?\))?/g, (whole, id: string) => FIELD_LABELS[id as FieldId] ?? whole);
  return readableMessage(named).replace(/^the /, 'The ');
}

/** Field wording for the engine's refusal codes; other codes carry the engine's own message. */
const REFUSAL_WORDING: Partial<Record<DerivationIssue['code'], string>> = {
  non_positive: 'Must be greater than zero.',
  negative_uncertainty: 'The uncertainty cannot be negative.',
  not_finite: 'Enter a finite number.',
};

function fieldMessage(issue: DerivationIssue): string {
  return REFUSAL_WORDING[issue.code] ?? wording(issue.message.replace(/^measurement \S+ refused: /, ''));
}

/**
 * What-if derivations in the browser: the measurements typed here go through
 * the same engine the server uses, and every derived value updates as they
 * change. Nothing is saved.
 */
export function Calculator() {
  const [form, setForm] = useState<CalculatorForm>(emptyForm);
  const inputs = useMemo(() => readForm(form), [form]);
  const deferred = useDeferredValue(inputs);
  const graph = useMemo(() => deriveAll(deferred.measurements, deferred.options), [deferred]);

  const errors: Partial<Record<FieldId, string>> = { ...inputs.fieldErrors };
  for (const issue of graph.issues) {
    const id = issue.measurementId as FieldId | undefined;
    if (id !== undefined && issue.code !== 'measurement_unused' && !errors[id]) errors[id] = fieldMessage(issue);
  }
  const quantityIssues = (q: QuantityId) => graph.issues.filter((i) => i.quantity === q && i.measurementId === undefined);

  const set = <K extends keyof CalculatorForm>(key: K) => (value: CalculatorForm[K]) => setForm((f) => ({ ...f, [key]: value }));

  const pickedLine = STRONG_LINES.find((l) => l.id === form.line.rest.line);
  const vacuumNote =
    form.line.medium === 'vacuum' && pickedLine
      ? `${pickedLine.label} in vacuum: ${nanometres(airToVacuumM(pickedLine.restWavelengthAirM))} nm (Morton 2000), compared with your vacuum wavelength.`
      : undefined;

  return (
    <div>
      <PageHeader
        title="Calculator"
        description="Type measurements with their 1σ uncertainties; every value that follows from them is derived as you type, with the same modules the server uses. Nothing here is saved."
        actions={
          <Button variant="secondary" size="sm" onClick={() => setForm(emptyForm())}>
            Clear all
          </Button>
        }
      />
      <Alert kind="notice" title="Derived values are estimates from simple models." className="mb-6">
        Each line names its model; read its warnings before trusting a number, and follow the team’s own reduction practice for
        publication.
      </Alert>

      <div className="grid gap-8 lg:grid-cols-[minmax(0,26rem)_minmax(0,1fr)]">
        <form className="space-y-5" onSubmit={(e) => e.preventDefault()} aria-label="Measurements">
          <FieldGroup legend="Continuum and spectrum">
            <MeasuredField
              label="Continuum peak wavelength"
              entry={form.peak}
              onChange={(e) => set('peak')({ ...form.peak, ...e })}
              unit={<UnitSelect label="Unit of the peak wavelength" value={form.peak.unit} options={WAVELENGTH_UNITS} onChange={(unit) => set('peak')({ ...form.peak, unit })} />}
              error={errors.peak}
              placeholder="e.g. 502"
            />
            <MeasuredField
              label="Planck-fit temperature"
              entry={form.planck}
              onChange={(e) => set('planck')({ ...form.planck, ...e })}
              unit="K"
              hint="From a least-squares Planck fit to a flux-calibrated spectrum."
              error={errors.planck}
            />
          </FieldGroup>

          <FieldGroup legend="Photometry">
            <MeasuredField label="B−V colour" entry={form.bv} onChange={set('bv')} unit="mag" error={errors.bv} />
            <MeasuredField
              label="Colour excess E(B−V)"
              entry={form.ebv}
              onChange={set('ebv')}
              unit="mag"
              hint={<Notation text="Dereddens B−V and gives A_V = R_V E(B−V); left empty, no reddening is assumed." />}
              error={errors.ebv}
            />
            <MeasuredField label="V magnitude" entry={form.v} onChange={set('v')} unit="mag" error={errors.v} />
            <MeasuredField
              label="Bolometric flux"
              entry={form.flux}
              onChange={(e) => set('flux')({ ...form.flux, ...e })}
              unit={<UnitSelect label="Unit of the bolometric flux" value={form.flux.unit} options={FLUX_UNITS} onChange={(unit) => set('flux')({ ...form.flux, unit })} />}
              hint="A measured flux takes precedence over one derived from V."
              error={errors.flux}
              placeholder="e.g. 2.5e-9"
            />
          </FieldGroup>

          <FieldGroup legend="Astrometry">
            <MeasuredField label="Parallax" entry={form.parallax} onChange={set('parallax')} unit="mas" error={errors.parallax} />
          </FieldGroup>

          <FieldGroup legend="Known from elsewhere">
            <MeasuredField
              label="Distance"
              entry={form.distance}
              onChange={(e) => set('distance')({ ...form.distance, ...e })}
              unit={<UnitSelect label="Unit of the distance" value={form.distance.unit} options={DISTANCE_UNITS} onChange={(unit) => set('distance')({ ...form.distance, unit })} />}
              hint="A cluster’s or a catalogue’s distance; used only where there is no parallax."
              error={errors.distance}
            />
            <MeasuredField
              label="Luminosity"
              entry={form.luminosity}
              onChange={(e) => set('luminosity')({ ...form.luminosity, ...e })}
              unit={<UnitSelect label="Unit of the luminosity" value={form.luminosity.unit} options={LUMINOSITY_UNITS} onChange={(unit) => set('luminosity')({ ...form.luminosity, unit })} />}
              hint="A standard candle’s; used as given, and with the flux it gives the distance."
              error={errors.luminosity}
            />
          </FieldGroup>

          <FieldGroup legend="Doppler shift of a line">
            <RestWavelengthField
              label="Rest wavelength"
              rest={form.line.rest}
              unit={form.line.unit}
              onChange={(rest) => set('line')({ ...form.line, rest })}
              vacuumNote={vacuumNote}
            />
            <MeasuredField
              label="Observed wavelength"
              entry={form.line}
              onChange={(e) => set('line')({ ...form.line, ...e })}
              unit={<UnitSelect label="Unit of the observed wavelength" value={form.line.unit} options={WAVELENGTH_UNITS} onChange={(unit) => set('line')({ ...form.line, unit })} />}
              error={errors.line}
            />
            <label className="flex items-center gap-2 py-1 text-sm text-ink">
              Wavelengths measured in
              <select value={form.line.medium} onChange={(e) => set('line')({ ...form.line, medium: e.target.value as Medium })} className={selectClasses}>
                <option value="air">air</option>
                <option value="vacuum">vacuum</option>
              </select>
            </label>
          </FieldGroup>

          <FieldGroup legend="Rotation">
            <RestWavelengthField label="Line" rest={form.limb.rest} unit={form.limb.unit} onChange={(rest) => set('limb')({ ...form.limb, rest })} />
            <MeasuredField
              label="Separation between the two limbs"
              entry={form.limb}
              onChange={(e) => set('limb')({ ...form.limb, ...e })}
              unit={<UnitSelect label="Unit of the limb separation" value={form.limb.unit} options={WAVELENGTH_UNITS} onChange={(unit) => set('limb')({ ...form.limb, unit })} />}
              hint="The line’s wavelength on the receding limb minus that on the approaching limb."
              error={errors.limb}
            />
          </FieldGroup>

          <FieldGroup legend="Zeeman splitting">
            <RestWavelengthField label="Line" rest={form.zeeman.rest} unit={form.zeeman.unit} onChange={(rest) => set('zeeman')({ ...form.zeeman, rest })} />
            <MeasuredField
              label="Zeeman shift"
              entry={form.zeeman}
              onChange={(e) => set('zeeman')({ ...form.zeeman, ...e })}
              unit={<UnitSelect label="Unit of the Zeeman shift" value={form.zeeman.unit} options={WAVELENGTH_UNITS} onChange={(unit) => set('zeeman')({ ...form.zeeman, unit })} />}
              hint="Distance of one σ component from the line centre (half the σ⁺–σ⁻ distance)."
              error={errors.zeeman}
            />
            <label className="flex items-center gap-2 py-1 text-sm font-semibold text-ink">
              Landé g
              <input
                inputMode="decimal"
                autoComplete="off"
                value={form.zeeman.landeG}
                onChange={(e) => set('zeeman')({ ...form.zeeman, landeG: e.target.value })}
                className="w-24 rounded-sm border border-rule bg-paper px-2 py-1.5 text-sm font-normal text-ink tabular-nums hover:border-ink-soft"
              />
            </label>
          </FieldGroup>

          <FieldGroup legend="Assumptions">
            <label className="block py-2 text-sm font-semibold text-ink">
              Assumed luminosity class
              <select
                value={form.assumedClass}
                onChange={(e) => set('assumedClass')(e.target.value as LuminosityClassName)}
                className={`${selectClasses} mt-1 block w-full font-normal`}
              >
                {LUMINOSITY_CLASSES.map((c) => (
                  <option key={c} value={c}>
                    {LUMINOSITY_CLASS_LABELS[c]}
                  </option>
                ))}
              </select>
              <span className="mt-1 block text-xs font-normal text-ink-soft">Used by the spectroscopic parallax and the radius check.</span>
            </label>
            <label className="block py-2 text-sm font-semibold text-ink">
              <Notation text="R_V = A_V / E(B−V)" />
              <input
                inputMode="decimal"
                autoComplete="off"
                value={form.rV}
                onChange={(e) => set('rV')(e.target.value)}
                aria-invalid={errors.rV ? true : undefined}
                className="mt-1 block w-24 rounded-sm border border-rule bg-paper px-2 py-1.5 text-sm font-normal text-ink tabular-nums hover:border-ink-soft"
              />
              <span className="mt-1 block text-xs font-normal text-ink-soft">3.1 is the diffuse interstellar mean (Cardelli, Clayton & Mathis 1989).</span>
              {errors.rV ? <span className="mt-1 block text-sm font-medium text-alert">{errors.rV}</span> : null}
            </label>
          </FieldGroup>
        </form>

        <div role="region" aria-label="Derived values">
          {SECTIONS.map((section) => (
            <section key={section.title} className="mb-6">
              <h2 className="mb-1 border-b border-rule pb-1 font-serif text-xl font-semibold text-ink">{section.title}</h2>
              <dl>
                {section.quantities.map((q) => (
                  <LedgerLine key={q} quantity={q} result={graph.results[q]} issues={quantityIssues(q)} needs={NEEDS[q]} wording={wording} />
                ))}
              </dl>
              {section.note ? <p className="mt-2 text-xs text-ink-soft">{section.note}</p> : null}
            </section>
          ))}
          <p className="rounded-sm border border-rule bg-paper-deep px-4 py-3 text-sm text-ink">
            A line’s absence from a spectrum does not mean the element is absent: hot stars ionise hydrogen, cool stars keep it in
            the ground state. Temperature, not composition, drives most differences between stellar spectra.
          </p>
        </div>
      </div>
    </div>
  );
}
