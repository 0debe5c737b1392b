import { FILE_QUANTITIES } from '@shared/file-reading/measurement-file';
import { linkClasses } from '@/components/ui/button';
import { uploadDownloads } from '../api/keys';

/** Served from public/samples: a small long-layout night for the demo programme's first targets. */
const SAMPLE_FILE = '/samples/glasswing-night.csv';

/** The two templates, a sample night, and the file's columns in brief. */
export function FileGuide({ projectId }: { projectId: number }) {
  return (
    <div className="space-y-3 text-sm">
      <ul className="space-y-1">
        <li>
          <a className={linkClasses} href={uploadDownloads.template(projectId, 'long')} download>
            Long template (long.csv)
          </a>{' '}
          <span className="text-ink-soft">— one measurement per row; what pipelines write.</span>
        </li>
        <li>
          <a className={linkClasses} href={uploadDownloads.template(projectId, 'wide')} download>
            Wide template (wide.csv)
          </a>{' '}
          <span className="text-ink-soft">— one row per target and night, a column per quantity.</span>
        </li>
        <li>
          <a className={linkClasses} href={SAMPLE_FILE} download="glasswing-night.csv">
            sample file
          </a>{' '}
          <span className="text-ink-soft">— an invented night for GW 101–GW 105 in the long layout.</span>
        </li>
      </ul>
      <p className="text-ink-soft">
        Long layout columns: <code>target</code>, <code>quantity</code>, <code>value</code> and (for dimensional quantities){' '}
        <code>unit</code> are required; <code>ra</code>, <code>dec</code> (for a new target), <code>uncertainty</code> (1σ, same unit),{' '}
        <code>band</code>, <code>rest_wavelength</code>, <code>lande_g</code>, <code>observed_at</code> (ISO 8601, UTC),{' '}
        <code>instrument</code> and <code>note</code> are read when present. Other columns are kept as notes.
      </p>
      <p className="text-ink-soft">
        Quantities: {FILE_QUANTITIES.map((q, i) => (
          <span key={q}>
            {i > 0 ? ', ' : ''}
            <code>{q}</code>
          </span>
        ))}
        . Write decimals with a point.
      </p>
    </div>
  );
}
