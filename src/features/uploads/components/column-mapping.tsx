import { useState, type ComponentProps, type FormEvent } from 'react';
import {
  FIELDS,
  FILE_QUANTITIES,
  columnMapping,
  readNumber,
  type ColumnMapping,
  type ColumnRole,
  type Field,
  type FileQuantity,
  type RowError,
} from '@shared/file-reading/measurement-file';
import { ALLOWED_UNITS } from '@shared/physics/units';
import { NEEDS_BAND, NEEDS_REST_WAVELENGTH } from '@shared/physics/measurement-rules';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { cn } from '@/lib/cn';
import { FIELD_NAMES, MEASUREMENT_KIND_NAMES, unitSymbol } from '@/lib/measurement-words';


/** One column's choice as the form holds it: text boxes stay text until "Apply mapping". */
interface Draft {
  /** `field:<name>`, `measurement`, `uncertainty:<column>`, `extra` or `ignore`. */
  choice: string;
  quantity: FileQuantity;
  unit: string;
  band: string;
  rest: string;
  lande: string;
}

function draftOf(role: ColumnRole | undefined): Draft {
  const blank: Draft = { choice: 'extra', quantity: 'magnitude', unit: 'mag', band: '', rest: '', lande: '' };
  if (!role) return blank;
  switch (role.role) {
    case 'field':
      return { ...blank, choice: `field:${role.field}` };
    case 'measurement':
      return {
        choice: 'measurement',
        quantity: role.quantity,
        unit: role.unit ?? ALLOWED_UNITS[role.quantity][0],
        band: role.band ?? '',
        rest: role.restWavelength === undefined ? '' : String(role.restWavelength),
        lande: role.landeG === undefined ? '' : String(role.landeG),
      };
    case 'uncertainty':
      return { ...blank, choice: `uncertainty:${role.of}` };
    case 'ignore':
      return { ...blank, choice: 'ignore' };
    default:
      return blank;
  }
}

/** The mapping the form describes, or the problems that stop it being sent, each naming its column. */
function buildMapping(layout: ColumnMapping['layout'], headers: string[], drafts: Record<string, Draft>): { mapping?: ColumnMapping; problems: Record<string, string> } {
  const problems: Record<string, string> = {};
  const columns: Record<string, ColumnRole> = {};
  for (const header of headers) {
    const d = drafts[header];
    if (d.choice.startsWith('field:')) columns[header] = { role: 'field', field: d.choice.slice(6) as Field };
    else if (d.choice.startsWith('uncertainty:')) columns[header] = { role: 'uncertainty', of: d.choice.slice(12) };
    else if (d.choice === 'ignore') columns[header] = { role: 'ignore' };
    else if (d.choice === 'measurement') {
      const role: Extract<ColumnRole, { role: 'measurement' }> = { role: 'measurement', quantity: d.quantity, unit: d.unit };
      if (d.band.trim()) role.band = d.band.trim();
      else if (NEEDS_BAND.has(d.quantity)) problems[header] = `Column “${header}”: give the band of this ${MEASUREMENT_KIND_NAMES[d.quantity].toLowerCase()} (for example V, or B-V).`;
      if (d.rest.trim()) {
        const r = readNumber(d.rest, 'the rest wavelength');
        if (!r.ok) problems[header] = `Column “${header}”: ${r.message}`;
        else if (r.value <= 0) problems[header] = `Column “${header}”: the rest wavelength must be positive.`;
        else role.restWavelength = r.value;
      } else if (NEEDS_REST_WAVELENGTH.has(d.quantity)) problems[header] = `Column “${header}”: give the line’s rest wavelength, in ${unitSymbol(d.unit)}.`;
      if (d.lande.trim()) {
        const g = readNumber(d.lande, 'the Landé g factor');
        if (!g.ok) problems[header] = `Column “${header}”: ${g.message}`;
        else role.landeG = g.value;
      } else if (d.quantity === 'zeeman_separation') problems[header] = `Column “${header}”: give the line’s Landé g factor.`;
      columns[header] = role;
    } else columns[header] = { role: 'extra' };
  }
  if (Object.keys(problems).length > 0) return { problems };
  const parsed = columnMapping.safeParse({ layout, columns });
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const column = String(issue.path[1] ?? '');
      problems[column] = `Column “${column}”: ${issue.message}`;
    }
    return { problems };
  }
  return { mapping: parsed.data, problems };
}

const inputClasses = 'rounded-sm border border-rule bg-paper px-2 py-1 text-sm text-ink hover:border-ink-soft';

/** A measured column's detail (band, rest wavelength, Landé g) as a text box under its caption. */
function DetailInput({ label, className, ...input }: { label: string } & ComponentProps<'input'>) {
  return (
    <label className="text-xs text-ink-soft">
      {label}
      <input className={cn(inputClasses, 'block', className)} {...input} />
    </label>
  );
}

/**
 * Says what each column of the file holds. Prefilled with the server's
 * suggestion, or the mapping the project last used for a file with the same
 * header. "Apply mapping" reads the kept file again; nothing is imported.
 */
export function ColumnMappingForm({
  upload,
  sample,
  canEdit,
  pending,
  error,
  onApply,
}: {
  upload: { headers: string[]; mapping: ColumnMapping | null; errors: RowError[] };
  /** The first data row, to show what each column looks like. */
  sample: string[] | null;
  canEdit: boolean;
  pending: boolean;
  error: string | null;
  onApply: (mapping: ColumnMapping) => void;
}) {
  const { headers } = upload;
  const [layout, setLayout] = useState<ColumnMapping['layout']>(upload.mapping?.layout ?? 'long');
  const [drafts, setDrafts] = useState<Record<string, Draft>>(() =>
    Object.fromEntries(headers.map((h) => [h, draftOf(upload.mapping?.columns[h])])),
  );
  const [problems, setProblems] = useState<Record<string, string>>({});
  const headerErrors = upload.errors.filter((e) => e.row === 1);
  const errorFor = (header: string) => problems[header] ?? headerErrors.find((e) => e.column === header)?.message;
  const unplaced = headerErrors.filter((e) => !headers.includes(e.column));

  const update = (header: string, change: Partial<Draft>) => {
    setDrafts((all) => ({ ...all, [header]: { ...all[header], ...change } }));
    setProblems((p) => {
      const rest = { ...p };
      delete rest[header];
      return rest;
    });
  };

  function submit(event: FormEvent) {
    event.preventDefault();
    const built = buildMapping(layout, headers, drafts);
    setProblems(built.problems);
    if (built.mapping) onApply(built.mapping);
  }

  return (
    <form onSubmit={submit} aria-label="Column mapping" noValidate>
      <fieldset className="mb-4 flex flex-wrap items-center gap-x-6 gap-y-2 text-sm" disabled={!canEdit || pending}>
        <legend className="mb-1 font-semibold">Layout</legend>
        <label className="flex items-center gap-2">
          <input type="radio" name="layout" value="long" checked={layout === 'long'} onChange={() => setLayout('long')} className="accent-[var(--sl-brass)]" />
          Long — one measurement per row (target, quantity, value, unit…)
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" name="layout" value="wide" checked={layout === 'wide'} onChange={() => setLayout('wide')} className="accent-[var(--sl-brass)]" />
          Wide — one row per target and night, a column per measured quantity
        </label>
      </fieldset>

      {unplaced.length > 0 ? (
        <Alert title="The mapping is not complete." className="mb-4">
          <ul className="list-disc pl-5">
            {unplaced.map((e, i) => (
              <li key={i}>{e.message}</li>
            ))}
          </ul>
        </Alert>
      ) : null}

      <LedgerTable aria-label="Columns of the file">
        <LedgerHead>
          <tr>
            <LedgerHeaderCell scope="col">Column</LedgerHeaderCell>
            <LedgerHeaderCell scope="col">First row</LedgerHeaderCell>
            <LedgerHeaderCell scope="col">Holds</LedgerHeaderCell>
            <LedgerHeaderCell scope="col">Measured quantity details</LedgerHeaderCell>
          </tr>
        </LedgerHead>
        <LedgerBody>
          {headers.map((header, i) => {
            const d = drafts[header];
            const message = errorFor(header);
            const selectId = `mapping-${i}`;
            return (
              <LedgerRow key={header} className="align-top">
                <LedgerCell>
                  <label htmlFor={selectId} className="font-mono text-sm font-semibold">
                    {header || `(column ${i + 1} has no name)`}
                  </label>
                </LedgerCell>
                <LedgerCell className="max-w-48 truncate font-mono text-xs text-ink-soft">{sample?.[i] ?? ''}</LedgerCell>
                <LedgerCell>
                  <select
                    id={selectId}
                    value={d.choice}
                    disabled={!canEdit || pending}
                    aria-invalid={message ? true : undefined}
                    aria-describedby={message ? `${selectId}-error` : undefined}
                    onChange={(e) => update(header, { choice: e.target.value })}
                    className={cn(inputClasses, 'w-full min-w-56', message && 'border-2 border-alert')}
                  >
                    <optgroup label="A field of the row">
                      {FIELDS.map((f) => (
                        <option key={f} value={`field:${f}`}>
                          {FIELD_NAMES[f]} ({f})
                        </option>
                      ))}
                    </optgroup>
                    <optgroup label="Wide layout: a column per quantity">
                      <option value="measurement">Measured quantity…</option>
                      {headers
                        .filter((other) => other !== header)
                        .map((other) => (
                          <option key={other} value={`uncertainty:${other}`}>
                            Uncertainty of “{other}”
                          </option>
                        ))}
                    </optgroup>
                    <optgroup label="Other">
                      <option value="extra">Keep as note</option>
                      <option value="ignore">Ignore</option>
                    </optgroup>
                  </select>
                  {message ? (
                    <p id={`${selectId}-error`} className="mt-1 text-sm text-alert">
                      <span className="font-semibold">Error:</span> {message}
                    </p>
                  ) : null}
                  {layout === 'long' && (d.choice === 'measurement' || d.choice.startsWith('uncertainty:')) ? (
                    <p className="mt-1 text-xs text-ink-soft">Used only in the wide layout; the long layout keeps this column as a note.</p>
                  ) : null}
                </LedgerCell>
                <LedgerCell>
                  {d.choice === 'measurement' ? (
                    <div className="flex flex-wrap items-end gap-2" role="group" aria-label={`Quantity in column ${header}`}>
                      <label className="text-xs text-ink-soft">
                        Quantity
                        <select
                          className={cn(inputClasses, 'block')}
                          value={d.quantity}
                          disabled={!canEdit || pending}
                          onChange={(e) => {
                            const quantity = e.target.value as FileQuantity;
                            update(header, { quantity, unit: ALLOWED_UNITS[quantity][0] });
                          }}
                        >
                          {FILE_QUANTITIES.map((q) => (
                            <option key={q} value={q}>
                              {MEASUREMENT_KIND_NAMES[q]}
                            </option>
                          ))}
                        </select>
                      </label>
                      <label className="text-xs text-ink-soft">
                        Unit
                        <select
                          className={cn(inputClasses, 'block')}
                          value={d.unit}
                          disabled={!canEdit || pending}
                          onChange={(e) => update(header, { unit: e.target.value })}
                        >
                          {ALLOWED_UNITS[d.quantity].map((u) => (
                            <option key={u} value={u}>
                              {unitSymbol(u)}
                            </option>
                          ))}
                        </select>
                      </label>
                      {NEEDS_BAND.has(d.quantity) ? (
                        <DetailInput
                          label="Band"
                          className="w-20"
                          value={d.band}
                          disabled={!canEdit || pending}
                          placeholder={d.quantity === 'colour_index' ? 'B-V' : 'V'}
                          onChange={(e) => update(header, { band: e.target.value })}
                        />
                      ) : null}
                      {NEEDS_REST_WAVELENGTH.has(d.quantity) ? (
                        <DetailInput
                          label={`Rest wavelength (${unitSymbol(d.unit)})`}
                          className="w-28"
                          inputMode="decimal"
                          value={d.rest}
                          disabled={!canEdit || pending}
                          onChange={(e) => update(header, { rest: e.target.value })}
                        />
                      ) : null}
                      {d.quantity === 'zeeman_separation' ? (
                        <DetailInput
                          label="Landé g"
                          className="w-20"
                          inputMode="decimal"
                          value={d.lande}
                          disabled={!canEdit || pending}
                          onChange={(e) => update(header, { lande: e.target.value })}
                        />
                      ) : null}
                    </div>
                  ) : (
                    <span className="text-xs text-ink-soft">—</span>
                  )}
                </LedgerCell>
              </LedgerRow>
            );
          })}
        </LedgerBody>
      </LedgerTable>

      {error ? (
        <Alert title="The mapping was not applied." className="mt-4">
          {error}
        </Alert>
      ) : null}
      {canEdit ? (
        <div className="mt-4 flex flex-wrap items-center gap-3">
          <Button type="submit" disabled={pending}>
            {pending ? 'Reading the file again…' : 'Apply mapping'}
          </Button>
          <p className="text-sm text-ink-soft">The file is read again under this mapping; the preview below follows. Once committed, the project remembers it for files with the same header.</p>
        </div>
      ) : null}
    </form>
  );
}
