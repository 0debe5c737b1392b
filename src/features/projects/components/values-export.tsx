import { useId, useState } from 'react';
import type { ExportValuesQuery } from '@shared/schemas/derived';
import { Section } from '@/components/ui/page-header';
import { buttonClasses } from '@/components/ui/button';
import { valuesExportHref } from '../api/export-values';

const formats: { format: ExportValuesQuery['format']; label: string }[] = [
  { format: 'csv', label: 'CSV' },
  { format: 'votable', label: 'VOTable' },
];

/**
 * Links that download the project's values, one row per target, in SI
 * units. Members who may see proposals choose whether the newest proposed
 * revisions come along; a reader's file holds approved values only (the
 * server holds to that whatever the link says).
 */
export function ValuesExport({ projectId, canSeeProposed }: { projectId: number; canSeeProposed: boolean }) {
  const [include, setInclude] = useState<ExportValuesQuery['include']>('approved');
  const chosen = canSeeProposed ? include : 'approved';
  const name = useId();

  return (
    // Download links mean nothing on paper.
    <div data-print="hide">
      <Section title="Export values" className="mt-8">
        <p className="mb-3 max-w-3xl text-sm text-ink-soft">
          One row per target: designation, RA and Dec (J2000, degrees), then for each derived quantity its value, 1σ, status and revision, in SI units (K, W,
          m, m/s, T). CSV for spreadsheets and scripts; VOTable 1.4 (IVOA), with a unit and a UCD on every column, for virtual-observatory tools.
          {canSeeProposed ? null : ' The file holds approved values only.'}
        </p>
        {canSeeProposed ? (
          <fieldset className="mb-3 flex flex-wrap items-center gap-x-6 gap-y-2 text-sm">
            <legend className="mb-1 font-semibold text-ink">Values</legend>
            <label className="flex items-center gap-2">
              <input type="radio" name={name} value="approved" checked={include === 'approved'} onChange={() => setInclude('approved')} className="accent-[var(--sl-brass)]" />
              Approved only
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" name={name} value="proposed" checked={include === 'proposed'} onChange={() => setInclude('proposed')} className="accent-[var(--sl-brass)]" />
              Include proposed (the newest revision awaiting review)
            </label>
          </fieldset>
        ) : null}
        <ul className="flex flex-wrap gap-2">
          {formats.map(({ format, label }) => (
            <li key={format}>
              <a href={valuesExportHref(projectId, format, chosen)} download className={buttonClasses('secondary')}>
                Download {label}
                <span className="sr-only">{chosen === 'approved' ? ', approved values only' : ', including proposed values'}</span>
              </a>
            </li>
          ))}
        </ul>
      </Section>
    </div>
  );
}
