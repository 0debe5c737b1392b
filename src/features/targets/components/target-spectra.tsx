import { useState } from 'react';
import { Link } from 'react-router-dom';
import { formatMeasured } from '@shared/physics/display';
import type { StoredSpectrum } from '@shared/schemas/uploads';
import { paths } from '@/config/paths';
import { SpectrumChart } from '@/components/charts/spectrum-chart';
import { linkClasses } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { formatDateTime } from '@/lib/format';

function optionText(spectrum: StoredSpectrum): string {
  const source = spectrum.uploadId === null ? 'entered directly' : `upload ${spectrum.uploadId}`;
  return `${formatDateTime(spectrum.createdAt)} · ${source} · ${formatMeasured(spectrum.fit.temperatureK, spectrum.fit.temperatureSigmaK, 'K').text}`;
}

/**
 * A target's committed spectra, one at a time with its Planck fit; the
 * newest shows first. The chooser is for the screen only, so the line naming
 * the spectrum shown is what tells a printed sheet which one it carries.
 */
export function TargetSpectra({ projectId, designation, spectra }: { projectId: number; designation: string; spectra: StoredSpectrum[] }) {
  const [chosenId, setChosenId] = useState<number | null>(null);
  const shown = spectra.find((s) => s.id === chosenId) ?? spectra[0];
  if (!shown) return null;

  return (
    <div className="space-y-3">
      {spectra.length > 1 ? (
        <div data-print="hide">
          <SelectField
            label="Spectrum"
            className="max-w-xl"
            value={shown.id}
            onChange={(e) => setChosenId(Number(e.target.value))}
            hint="Newest first."
          >
            {spectra.map((s) => (
              <option key={s.id} value={s.id}>
                {optionText(s)}
              </option>
            ))}
          </SelectField>
        </div>
      ) : null}
      <p className="text-sm text-ink-soft" data-testid="spectrum-source">
        Committed {formatDateTime(shown.createdAt)}
        {shown.uploadId === null ? (
          ', entered directly'
        ) : (
          <>
            {' from '}
            <Link className={linkClasses} to={paths.project.uploadPreview.getHref(projectId, shown.uploadId)}>
              upload {shown.uploadId}
            </Link>
          </>
        )}
        {spectra.length > 1 ? `; ${spectra.length} spectra of this target in all.` : '.'}
      </p>
      <SpectrumChart key={shown.id} points={shown.points} pointCount={shown.pointCount} fit={shown.fit} designation={designation} />
    </div>
  );
}
