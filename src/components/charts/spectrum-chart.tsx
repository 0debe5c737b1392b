import { useMemo, type ReactNode } from 'react';
import { CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatMeasured } from '@shared/physics/display';
import { planckSpectralRadiance } from '@shared/physics/planck';
import type { SpectrumPreview } from '@shared/schemas/uploads';
import { DetailItem, DetailList } from '@/components/ui/detail-list';

/** A Planck fit as the server sends it, for an upload's preview or a stored spectrum alike. */
export type SpectrumFit = NonNullable<SpectrumPreview['fit']>;

/** More points than a chart this wide can show; beyond it every n-th point is drawn (the fit used them all). */
const MOST_POINTS_DRAWN = 1500;

const fluxTick = (v: number) => (v === 0 ? '0' : Math.abs(v) >= 1e4 || Math.abs(v) < 1e-2 ? v.toExponential(1).replace('-', '−') : v.toPrecision(3));

/** The server's method words as a sentence. */
const sentence = (words: string) => `${words.charAt(0).toUpperCase()}${words.slice(1)}.`;

/** The continuum peak in nm, or null when the data do not turn over inside the range. */
function peakOf(fit: SpectrumFit) {
  return fit.peakWavelengthM != null && fit.peakWavelengthSigmaM != null ? formatMeasured(fit.peakWavelengthM * 1e9, fit.peakWavelengthSigmaM * 1e9, 'nm') : null;
}

/**
 * The fit in figures. The reduced χ² is a goodness-of-fit number only when
 * the file gave flux uncertainties; without them the server weighted the
 * points by a noise level estimated from the scatter itself, so its χ² is
 * near 1 by construction, and what is shown instead is that assumption.
 */
function FitDetails({ fit, pointCount }: { fit: SpectrumFit; pointCount: number }) {
  const temperature = formatMeasured(fit.temperatureK, fit.temperatureSigmaK, 'K');
  const peak = peakOf(fit);
  return (
    <DetailList>
      <DetailItem label="Planck-fit temperature" numeric>
        <span className="font-semibold" data-testid="spectrum-temperature">
          {temperature.text}
        </span>
        <span className="block text-xs text-ink-soft">Least-squares fit of the Planck function</span>
      </DetailItem>
      {fit.weighted ? (
        <DetailItem label="Reduced χ²" numeric>
          <span data-testid="spectrum-fit-quality">{formatMeasured(fit.reducedChiSquare, 0, '').text}</span>
          <span className="block text-xs text-ink-soft">Near 1 when the flux uncertainties are honest and the curve fits.</span>
        </DetailItem>
      ) : (
        <DetailItem label="Weighting">
          <span data-testid="spectrum-fit-quality">{sentence(fit.noiseWords ?? 'no flux uncertainties given; σ from the scatter about the fit')}</span>
        </DetailItem>
      )}
      <DetailItem label="Continuum peak" numeric={peak !== null}>
        {peak ? (
          peak.text
        ) : (
          <span data-testid="spectrum-no-peak">
            None recorded. {fit.noPeakReason ?? 'The continuum does not turn over inside the observed range.'}
          </span>
        )}
      </DetailItem>
      <DetailItem label="Points" numeric>
        {pointCount}
      </DetailItem>
    </DetailList>
  );
}

/**
 * A spectrum as sent (flux against wavelength in nm) with the fitted Planck
 * curve drawn over it and the continuum peak marked, computed in the browser
 * with the same Planck function the server fitted; beside it the fit in
 * figures, its warnings and a word on reading spectra. `children` go
 * under the warnings, for what only one page has to say.
 */
export function SpectrumChart({
  points,
  fit,
  designation,
  children,
}: {
  /** [wavelength m, flux as sent] */
  points: readonly [number, number][];
  fit: SpectrumFit | null;
  designation: string | null;
  children?: ReactNode;
}) {
  const data = useMemo(() => {
    const stride = Math.max(1, Math.ceil(points.length / MOST_POINTS_DRAWN));
    const scale = fit ? Math.exp(fit.logScale) : 0;
    return points
      .filter((_, i) => i % stride === 0)
      .map(([wavelengthM, flux]) => ({
        nm: wavelengthM * 1e9,
        flux,
        fit: fit ? planckSpectralRadiance(wavelengthM, fit.temperatureK) * scale : undefined,
      }));
  }, [points, fit]);

  if (data.length === 0) return <p className="text-sm text-ink-soft italic">No points could be read from the file.</p>;

  const peakNm = fit?.peakWavelengthM != null ? fit.peakWavelengthM * 1e9 : null;
  const temperature = fit ? formatMeasured(fit.temperatureK, fit.temperatureSigmaK, 'K') : null;
  const peak = fit ? peakOf(fit) : null;
  const first = data[0].nm;
  const last = data[data.length - 1].nm;
  const description = `Spectrum${designation ? ` of ${designation}` : ''}: ${points.length} points from ${first.toFixed(0)} to ${last.toFixed(0)} nm${
    temperature ? `; Planck fit ${temperature.text}; ${peak ? `continuum peak ${peak.text}` : 'no continuum peak inside the range'}` : '; no Planck fit'
  }.`;

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)] print:grid-cols-1">
      <figure className="break-inside-avoid">
        {/* Paper has no pointer: a tooltip left open by the last hover would print as part of the figure. */}
        <div
          role="img"
          aria-label={description}
          className="h-80 w-full print:[&_.recharts-tooltip-cursor]:hidden print:[&_.recharts-tooltip-wrapper]:hidden"
          data-testid="spectrum-chart"
        >
          <ResponsiveContainer width="100%" height="100%">
            <ComposedChart data={data} margin={{ top: 16, right: 16, bottom: 24, left: 24 }}>
              <CartesianGrid stroke="var(--sl-rule)" strokeDasharray="2 4" />
              <XAxis
                dataKey="nm"
                type="number"
                domain={['dataMin', 'dataMax']}
                tickFormatter={(v: number) => v.toFixed(0)}
                stroke="var(--sl-ink-soft)"
                label={{ value: 'Wavelength (nm)', position: 'insideBottom', offset: -12, fill: 'var(--sl-ink)' }}
              />
              <YAxis
                tickFormatter={fluxTick}
                stroke="var(--sl-ink-soft)"
                width={64}
                label={{ value: 'Flux (as sent)', angle: -90, position: 'left', offset: 8, fill: 'var(--sl-ink)', style: { textAnchor: 'middle' } }}
              />
              <Tooltip
                formatter={(value, name) => [typeof value === 'number' ? value.toPrecision(4) : String(value), name]}
                labelFormatter={(label) => `${Number(label).toFixed(1)} nm`}
                contentStyle={{ background: 'var(--sl-paper)', borderColor: 'var(--sl-rule)', color: 'var(--sl-ink)' }}
              />
              <Legend verticalAlign="top" height={28} />
              <Line
                type="linear"
                dataKey="flux"
                name="Spectrum as sent"
                stroke="var(--sl-ink)"
                strokeWidth={1.25}
                dot={false}
                isAnimationActive={false}
              />
              {fit ? (
                <Line
                  type="monotone"
                  dataKey="fit"
                  name={`Planck fit, ${temperature?.text}`}
                  stroke="var(--sl-brass)"
                  strokeWidth={2.5}
                  strokeDasharray="8 4"
                  dot={false}
                  isAnimationActive={false}
                />
              ) : null}
              {peakNm !== null ? (
                <ReferenceLine
                  x={peakNm}
                  stroke="var(--sl-alert)"
                  strokeDasharray="3 3"
                  // The label sits on the side of the line with more room, so it is never cut at the plot's edge.
                  label={{
                    value: `Continuum peak ${peak?.text}`,
                    position: peakNm - first < last - peakNm ? 'insideBottomLeft' : 'insideBottomRight',
                    fill: 'var(--sl-ink)',
                    fontSize: 12,
                  }}
                />
              ) : null}
            </ComposedChart>
          </ResponsiveContainer>
        </div>
        <figcaption className="mt-2 text-xs text-ink-soft">
          Solid line: the spectrum as sent. Dashed line: the Planck curve of the fitted temperature, scaled by the fitted factor.
          {peakNm !== null ? ' Dotted vertical line: the continuum peak.' : null}
        </figcaption>
      </figure>
      <div className="break-inside-avoid">
        {fit ? <FitDetails fit={fit} pointCount={points.length} /> : null}
        {fit?.warnings.length ? (
          <ul className="mt-3 space-y-1 text-sm">
            {fit.warnings.map((w, i) => (
              <li key={i}>
                <span className="font-semibold text-alert">Warning:</span> {w.message}
              </li>
            ))}
          </ul>
        ) : null}
        {children}
        <p className="mt-4 text-xs text-ink-soft">
          A line missing from a spectrum does not mean the element is missing from the star: hot stars ionise their hydrogen and cool
          stars keep it in the ground state. Temperature, more than composition, sets how a stellar spectrum looks.
        </p>
      </div>
    </div>
  );
}
