import { Link } from 'react-router-dom';
import type { Measurement } from '@shared/schemas/derived';
import { formatMeasured } from '@shared/physics/display';
import { fromSi, UNITS, type UnitName } from '@shared/physics/units';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { formatDateTime } from '@/lib/format';
import { bandName, measurementKindName, unitSymbol } from '@/lib/measurement-words';

const MAG_KINDS = new Set(['magnitude', 'colour_index', 'extinction']);

const decimalsOf = (n: number) => (Number.isInteger(n) || /e/i.test(String(n)) ? 0 : String(n).split('.')[1].length);

/**
 * A number as the file gave it, with a true minus sign. The file's text is
 * not kept, only its value, so trailing zeros come back from the σ's
 * decimal places: 8.00 ± 0.02 rather than 8 ± 0.02.
 */
function asWritten(n: number, sigma?: number | null): string {
  const places = Math.max(decimalsOf(n), sigma == null ? 0 : decimalsOf(sigma));
  const text = /e/i.test(String(n)) ? String(n) : n.toFixed(places);
  return text.replace(/-/g, '−');
}

/**
 * The value as the observer sent it. Values recorded from a spectrum fit were
 * never typed by anyone: they are printed like derived values, wavelengths
 * in nm.
 */
function sentValue(m: Measurement): string {
  if (m.rowNumber === null && m.unitAsSent === 'm') {
    return formatMeasured(fromSi(m.valueSi, 'nm'), fromSi(m.uncertaintySi ?? 0, 'nm'), 'nm').text;
  }
  if (m.rowNumber === null && m.unitAsSent === 'K') return formatMeasured(m.valueAsSent, m.uncertaintyAsSent ?? 0, 'K').text;
  const unit = unitSymbol(m.unitAsSent ?? (MAG_KINDS.has(m.kind) ? 'mag' : ''));
  const sigma = m.uncertaintyAsSent === null ? '' : ` ± ${asWritten(m.uncertaintyAsSent, m.valueAsSent)}`;
  return `${asWritten(m.valueAsSent, m.uncertaintyAsSent)}${sigma}${unit ? ` ${unit}` : ''}`;
}

/** Band for photometry; for a line, its rest wavelength in the unit the observed one came in. */
function bandOrLine(m: Measurement): string {
  if (m.band) return bandName(m.band);
  if (m.restWavelengthSi === null) return '';
  const unit = m.unitAsSent && Object.prototype.hasOwnProperty.call(UNITS, m.unitAsSent) ? (m.unitAsSent as UnitName) : 'nm';
  const rest = `rest ${asWritten(Number(fromSi(m.restWavelengthSi, unit).toPrecision(9)))} ${UNITS[unit].symbol}`;
  return m.landeG === null ? rest : `${rest}, g = ${asWritten(m.landeG)}`;
}

/** Every measurement of a target with where it came from: the upload and row, who observed it, when and with what. */
export function TargetMeasurements({ projectId, measurements }: { projectId: number; measurements: Measurement[] }) {
  return (
    <LedgerTable aria-label="Measurements" data-testid="measurements-table">
      <LedgerHead>
        <tr>
          <LedgerHeaderCell scope="col">Quantity</LedgerHeaderCell>
          <LedgerHeaderCell scope="col" numeric>
            Value as sent
          </LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Band or line</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Observed (UTC)</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Instrument</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Upload</LedgerHeaderCell>
          <LedgerHeaderCell scope="col" numeric>
            Row
          </LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Observer</LedgerHeaderCell>
        </tr>
      </LedgerHead>
      <LedgerBody>
        {measurements.map((m) => (
          <LedgerRow key={m.id} data-kind={m.kind}>
            <LedgerCell>
              {measurementKindName(m.kind)}
              {m.note ? <span className="block max-w-64 text-xs text-ink-soft">{m.note}</span> : null}
            </LedgerCell>
            <LedgerCell numeric>{sentValue(m)}</LedgerCell>
            <LedgerCell className="whitespace-nowrap tabular-nums">{bandOrLine(m) || <span className="text-ink-soft">—</span>}</LedgerCell>
            <LedgerCell className="whitespace-nowrap tabular-nums">
              {m.observedAt ? formatDateTime(m.observedAt) : <span className="text-ink-soft">not given</span>}
            </LedgerCell>
            <LedgerCell>{m.instrument ?? <span className="text-ink-soft">—</span>}</LedgerCell>
            <LedgerCell>
              {m.uploadId === null ? (
                <span className="text-ink-soft">entered directly</span>
              ) : (
                <Link className={`${linkClasses} whitespace-nowrap`} to={paths.project.uploadPreview.getHref(projectId, m.uploadId)}>
                  Upload {m.uploadId}
                </Link>
              )}
            </LedgerCell>
            <LedgerCell numeric>{m.rowNumber ?? <span className="text-ink-soft">{m.uploadId === null ? '—' : 'spectrum fit'}</span>}</LedgerCell>
            <LedgerCell>{m.observer ?? <span className="text-ink-soft">a former account</span>}</LedgerCell>
          </LedgerRow>
        ))}
      </LedgerBody>
    </LedgerTable>
  );
}
