import { lazy, Suspense, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { formatMeasured } from '@shared/physics/display';
import { planckSpectralRadiance } from '@shared/physics/planck';
import type { SpectrumPreview } from '@shared/schemas/uploads';
import { DetailItem, DetailList } from '@/components/ui/detail-list';
import { CHART_HEIGHT, PALETTE } from './spectrum-look';

/** The plot brings the charting library, fetched only when a spectrum is drawn. */
const SpectrumPlot = lazy(() => import('./spectrum-plot'));

/** A Planck fit as the server sends it, for an upload's preview or a stored spectrum alike. */
export type SpectrumFit = NonNullable<SpectrumPreview['fit']>;

/** The chart's width as laid out, so the number of ticks follows the room there is. */
function useWidth() {
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const observer = new ResizeObserver((entries) => setWidth(Math.floor(entries[0].contentRect.width)));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);
  return { box, width };
}

/** Our own legend: the chart's three marks, each with its swatch and words. */
function SpectrumLegend({ pointCount, drawnCount, fitText, peakText }: { pointCount: number; drawnCount: number; fitText: string | null; peakText: string | null }) {
  return (
    <ul className="mb-2 flex flex-wrap gap-x-5 gap-y-1 text-xs text-ink" data-testid="spectrum-legend">
      <li className="flex items-center gap-1.5">
        <svg width="22" height="10" aria-hidden="true">
          {[3, 8, 13, 18].map((x, i) => (
            <circle key={x} cx={x} cy={i % 2 === 0 ? 6 : 4} r={1.8} fill={PALETTE.points} fillOpacity={PALETTE.pointsOpacity} />
          ))}
        </svg>
        Spectrum as sent, {pointCount} points{drawnCount < pointCount ? ` (${drawnCount} drawn)` : ''}
      </li>
      {fitText ? (
        <li className="flex items-center gap-1.5">
          <svg width="22" height="10" aria-hidden="true">
            <path d="M1 5h20" stroke={PALETTE.halo} strokeWidth={7} />
            <path d="M1 5h20" stroke={PALETTE.fit} strokeWidth={3} />
          </svg>
          Planck fit, {fitText}
        </li>
      ) : null}
      {peakText ? (
        <li className="flex items-center gap-1.5">
          <svg width="12" height="12" aria-hidden="true">
            <path d="M6 0v12" stroke={PALETTE.peak} strokeWidth={1.5} strokeDasharray="3 2" />
          </svg>
          Continuum peak, {peakText}
        </li>
      ) : null}
    </ul>
  );
}

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
  pointCount,
  fit,
  designation,
  children,
}: {
  /** [wavelength m, flux as sent]: the points the server sent to be drawn (every n-th of a long spectrum; the fit used them all). */
  points: readonly [number, number][];
  /** How many points the spectrum has. */
  pointCount: number;
  fit: SpectrumFit | null;
  designation: string | null;
  children?: ReactNode;
}) {
  const data = useMemo(() => {
    const scale = fit ? Math.exp(fit.logScale) : 0;
    return points.map(([wavelengthM, flux]) => ({
        nm: wavelengthM * 1e9,
        flux,
        fit: fit ? planckSpectralRadiance(wavelengthM, fit.temperatureK) * scale : undefined,
      }));
  }, [points, fit]);
  const { box, width } = useWidth();

  if (data.length === 0) return <p className="text-sm text-ink-soft italic">No points could be read from the file.</p>;

  const peakNm = fit?.peakWavelengthM != null ? fit.peakWavelengthM * 1e9 : null;
  const temperature = fit ? formatMeasured(fit.temperatureK, fit.temperatureSigmaK, 'K') : null;
  const peak = fit ? peakOf(fit) : null;
  const first = data[0].nm;
  const last = data[data.length - 1].nm;
  const description = `Spectrum${designation ? ` of ${designation}` : ''}: ${pointCount} points from ${first.toFixed(0)} to ${last.toFixed(0)} nm${
    temperature ? `; Planck fit ${temperature.text}; ${peak ? `continuum peak ${peak.text}` : 'no continuum peak inside the range'}` : '; no Planck fit'
  }.`;

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)] print:grid-cols-1">
      <figure className="min-w-0 break-inside-avoid">
        <SpectrumLegend
          pointCount={pointCount}
          drawnCount={data.length}
          fitText={temperature ? temperature.text : null}
          peakText={peakNm !== null ? (peak?.text ?? null) : null}
        />
        {/* Paper has no pointer: a tooltip left open by the last hover would print as part of the figure. */}
        <div
          ref={box}
          role="img"
          aria-label={description}
          className="w-full print:[&_.recharts-tooltip-cursor]:hidden print:[&_.recharts-tooltip-wrapper]:hidden"
          style={{ height: CHART_HEIGHT }}
          data-testid="spectrum-chart"
        >
          {width > 0 ? (
            <Suspense fallback={null}>
              <SpectrumPlot data={data} width={width} first={first} last={last} peakNm={peakNm} peakText={peak?.text ?? null} hasFit={fit !== null} />
            </Suspense>
          ) : null}
        </div>
      </figure>
      <div className="break-inside-avoid">
        {fit ? <FitDetails fit={fit} pointCount={pointCount} /> : null}
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
