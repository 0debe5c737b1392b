import { z } from 'zod';
import { designationKey, parseDeclination, parseRightAscension } from '../coordinates';
import { measurementToSi } from '../physics/units';
import { MUST_BE_POSITIVE, MUST_NOT_BE_NEGATIVE, NEEDS_BAND, NEEDS_REST_WAVELENGTH } from '../physics/measurement-rules';
import { PhysicsError } from '../physics/errors';
import { MEASUREMENT_KINDS, type MeasurementKind } from '../physics/quantities';
import { designation as designationSchema } from '../schemas/targets';

/**
 * The measurement file (PRODUCT.md, "The measurement file"): CSV with a
 * header row. The long layout has one measurement per row; the wide layout
 * (one row per target and night, a column per quantity) is read through a
 * column mapping. Both become the same normalised rows, in SI, with every
 * problem reported by row and column rather than stopping at the first.
 */

/** What a file may measure: every measurement kind but the Planck temperature, which only a spectrum fit records. */
export type FileQuantity = Exclude<MeasurementKind, 'planck_temperature'>;
export const FILE_QUANTITIES = MEASUREMENT_KINDS.filter((k): k is FileQuantity => k !== 'planck_temperature') as [FileQuantity, ...FileQuantity[]];

export const FIELDS = [
  'target',
  'ra',
  'dec',
  'quantity',
  'value',
  'uncertainty',
  'unit',
  'band',
  'rest_wavelength',
  'lande_g',
  'observed_at',
  'instrument',
  'note',
] as const;
export type Field = (typeof FIELDS)[number];

/** Fields that describe the row rather than one measurement: shared by every measurement of a wide row. */
const ROW_FIELDS: readonly Field[] = ['target', 'ra', 'dec', 'observed_at', 'instrument', 'note'];

export const columnRole = z.discriminatedUnion('role', [
  z.object({ role: z.literal('field'), field: z.enum(FIELDS) }),
  z.object({
    role: z.literal('measurement'),
    quantity: z.enum(FILE_QUANTITIES),
    unit: z.string().max(16).optional(),
    band: z.string().max(16).optional(),
    restWavelength: z.number().positive().optional(),
    landeG: z.number().optional(),
  }),
  z.object({ role: z.literal('uncertainty'), of: z.string() }),
  z.object({ role: z.literal('extra') }),
  z.object({ role: z.literal('ignore') }),
]);
export type ColumnRole = z.infer<typeof columnRole>;

export const columnMapping = z.object({
  layout: z.enum(['long', 'wide']),
  columns: z.record(z.string(), columnRole),
});
export type ColumnMapping = z.infer<typeof columnMapping>;

export interface RowError {
  /** Line in the file, the header being row 1 (what a spreadsheet shows). */
  row: number;
  column: string;
  message: string;
}

export interface NormalisedRow {
  row: number;
  target: string;
  targetKey: string;
  raDeg: number | null;
  decDeg: number | null;
  kind: FileQuantity;
  value: number;
  uncertainty: number | null;
  unit: string | null;
  valueSi: number;
  uncertaintySi: number | null;
  unitSi: string;
  band: string | null;
  restWavelengthSi: number | null;
  landeG: number | null;
  observedAt: string | null;
  instrument: string | null;
  note: string;
  /** Unknown columns, kept as notes (as text, never evaluated). */
  extra: Record<string, string>;
}

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?\d+,\d+$/;
const ISO_8601 = /^\d{4}-\d{2}-\d{2}(?:[T ]\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})?)?$/;

export function normaliseHeader(header: string): string {
  return header.replace(/^\uFEFF/, '').trim().toLowerCase().replace(/[\s-]+/g, '_');
}

type NumberResult = { ok: true; value: number } | { ok: false; message: string };

/** A strict number: no thousands separators, a point for decimals. */
export function readNumber(text: string, what: string): NumberResult {
  const t = text.trim();
  if (DECIMAL_COMMA.test(t)) return { ok: false, message: `"${t}" has a decimal comma; write ${what} with a point (${t.replace(',', '.')}).` };
  if (!NUMBER.test(t)) return { ok: false, message: `${what} must be a number (got "${t}").` };
  const value = Number(t);
  if (!Number.isFinite(value)) return { ok: false, message: `${what} is out of range (got "${t}").` };
  return { ok: true, value };
}

/** The longest band and instrument the measurements table holds (migrations/20261201010000_measurements.ts); PostgreSQL refuses longer, SQLite would keep them. */
const MAX_LENGTH = { band: 16, instrument: 120 } as const;

function normaliseBand(band: string): string {
  return band.trim().replace(/[−–]/g, '-').replace(/\s+/g, '');
}

/** Suggests a mapping from a header row: the long layout when it has quantity and value columns, otherwise a wide guess. */
export function suggestMapping(headers: string[]): ColumnMapping {
  const names = headers.map(normaliseHeader);
  const isLong = names.includes('quantity') || names.includes('value');
  const columns: Record<string, ColumnRole> = {};
  headers.forEach((header, i) => {
    const name = names[i];
    if ((FIELDS as readonly string[]).includes(name) && (isLong || ROW_FIELDS.includes(name as Field))) {
      columns[header] = { role: 'field', field: name as Field };
      return;
    }
    if (!isLong) {
      const guess = guessWideColumn(name, headers, names);
      if (guess) {
        columns[header] = guess;
        return;
      }
    }
    columns[header] = { role: 'extra' };
  });
  return { layout: isLong ? 'long' : 'wide', columns };
}

const WIDE_GUESSES: { pattern: RegExp; role: (m: RegExpExecArray) => ColumnRole }[] = [
  { pattern: /^(?:mag_?|magnitude_?)?([ubvri])(?:_?mag)?$/, role: (m) => ({ role: 'measurement', quantity: 'magnitude', unit: 'mag', band: m[1].toUpperCase() }) },
  { pattern: /^([ubvri])_?([ubvri])$/, role: (m) => ({ role: 'measurement', quantity: 'colour_index', unit: 'mag', band: `${m[1].toUpperCase()}-${m[2].toUpperCase()}` }) },
  { pattern: /^(?:e_?\(?b_?v\)?|ebv|extinction)$/, role: () => ({ role: 'measurement', quantity: 'extinction', unit: 'mag' }) },
  { pattern: /^(?:parallax|plx)(?:_?(mas|arcsec))?$/, role: (m) => ({ role: 'measurement', quantity: 'parallax', unit: m[1] ?? 'mas' }) },
  { pattern: /^(?:peak_wavelength|peak|lambda_max)(?:_?(nm|angstrom|um|m))?$/, role: (m) => ({ role: 'measurement', quantity: 'peak_wavelength', unit: m[1] ?? 'nm' }) },
  { pattern: /^(?:bolometric_flux|fbol)(?:_?(w\/m2|erg\/s\/cm2))?$/, role: (m) => ({ role: 'measurement', quantity: 'bolometric_flux', unit: m[1] === 'erg/s/cm2' ? 'erg/s/cm2' : 'W/m2' }) },
  { pattern: /^(?:distance|dist)(?:_?(pc|kpc|ly))?$/, role: (m) => ({ role: 'measurement', quantity: 'distance', unit: m[1] ?? 'pc' }) },
  { pattern: /^(?:luminosity|lum)(?:_?(lsun|w))?$/, role: (m) => ({ role: 'measurement', quantity: 'luminosity', unit: m[1] === 'w' ? 'W' : 'Lsun' }) },
];

function guessWideColumn(name: string, headers: string[], names: string[]): ColumnRole | null {
  // Quantities first: "e_b_v" is E(B−V), not the uncertainty of "b_v".
  for (const g of WIDE_GUESSES) {
    const m = g.pattern.exec(name);
    if (m) return g.role(m);
  }
  const uncertaintyOf = /^(?:sigma_|err_|e_)(.+)$|^(.+?)(?:_err|_sigma|_unc|_uncertainty)$/.exec(name);
  if (uncertaintyOf) {
    const base = uncertaintyOf[1] ?? uncertaintyOf[2];
    const idx = names.findIndex((n) => n === base || n.startsWith(`${base}_`));
    if (idx >= 0) return { role: 'uncertainty', of: headers[idx] };
  }
  return null;
}

/** Checks a mapping against the header before any row is read; the errors name the column. */
export function checkMapping(headers: string[], mapping: ColumnMapping): RowError[] {
  const errors: RowError[] = [];
  const mapped = (field: Field) => Object.values(mapping.columns).some((r) => r.role === 'field' && r.field === field);
  for (const name of Object.keys(mapping.columns)) {
    if (!headers.includes(name)) errors.push({ row: 1, column: name, message: `The mapping names a column "${name}" that the file does not have.` });
  }
  if (!mapped('target')) errors.push({ row: 1, column: 'target', message: 'The file needs a target column (the designation).' });
  if (mapping.layout === 'long') {
    for (const f of ['quantity', 'value'] as const) {
      if (!mapped(f)) errors.push({ row: 1, column: f, message: `The long layout needs a ${f} column.` });
    }
  } else {
    if (!Object.values(mapping.columns).some((r) => r.role === 'measurement')) {
      errors.push({ row: 1, column: '', message: 'Map at least one column to a measured quantity.' });
    }
    for (const [name, r] of Object.entries(mapping.columns)) {
      if (r.role === 'uncertainty' && mapping.columns[r.of]?.role !== 'measurement') {
        errors.push({ row: 1, column: name, message: `"${name}" is the uncertainty of "${r.of}", which is not mapped to a quantity.` });
      }
    }
  }
  return errors;
}

interface Cell {
  text: string;
  column: string;
}

/** One measurement's cells, whichever layout they came from. */
interface RawMeasurement {
  row: number;
  cells: Partial<Record<Field, Cell>>;
  fixed?: { quantity: FileQuantity; unit?: string; band?: string; restWavelength?: number; landeG?: number };
  extra: Record<string, string>;
}

function toRawMeasurements(headers: string[], record: string[], rowNumber: number, mapping: ColumnMapping): RawMeasurement[] {
  const cells: Partial<Record<Field, Cell>> = {};
  const extra: Record<string, string> = {};
  headers.forEach((header, i) => {
    const role = mapping.columns[header] ?? { role: 'extra' };
    const text = record[i] ?? '';
    if (role.role === 'field') cells[role.field] = { text, column: header };
    else if (role.role === 'extra' && text.trim() !== '') extra[header] = text;
  });
  if (mapping.layout === 'long') return [{ row: rowNumber, cells, extra }];
  const out: RawMeasurement[] = [];
  headers.forEach((header, i) => {
    const role = mapping.columns[header];
    if (role?.role !== 'measurement' || (record[i] ?? '').trim() === '') return;
    const sigmaIdx = headers.findIndex((h) => {
      const r = mapping.columns[h];
      return r?.role === 'uncertainty' && r.of === header;
    });
    const own: Partial<Record<Field, Cell>> = {};
    for (const f of ROW_FIELDS) if (cells[f]) own[f] = cells[f];
    own.value = { text: record[i], column: header };
    if (sigmaIdx >= 0 && (record[sigmaIdx] ?? '').trim() !== '') own.uncertainty = { text: record[sigmaIdx], column: headers[sigmaIdx] };
    out.push({ row: rowNumber, cells: own, fixed: role, extra });
  });
  return out;
}

/**
 * A file names each target and night on many rows; what a designation or a
 * time reads as is worked out once per distinct text.
 */
class ReadCache {
  private designations = new Map<string, { key: string; problem: string | null }>();
  private times = new Map<string, string | null>();

  designation(text: string) {
    let hit = this.designations.get(text);
    if (!hit) {
      const parsed = designationSchema.safeParse(text);
      hit = { key: designationKey(text), problem: parsed.success ? null : parsed.error.issues[0].message };
      this.designations.set(text, hit);
    }
    return hit;
  }

  /** ISO 8601 text → the instant in UTC, or null when it is not one. A time without a zone is read as UTC. */
  time(text: string): string | null {
    if (!this.times.has(text)) {
      const ms = ISO_8601.test(text) ? Date.parse(/[zZ]|[+-]\d{2}:?\d{2}$/.test(text) || text.length === 10 ? text : `${text}Z`) : Number.NaN;
      this.times.set(text, Number.isNaN(ms) ? null : new Date(ms).toISOString());
    }
    return this.times.get(text)!;
  }
}

function normalise(raw: RawMeasurement, errors: RowError[], cache: ReadCache): NormalisedRow | null {
  const before = errors.length;
  const err = (field: Field, message: string) => errors.push({ row: raw.row, column: raw.cells[field]?.column ?? field, message });
  const text = (field: Field) => raw.cells[field]?.text.trim() ?? '';

  const target = text('target');
  const designation = target ? cache.designation(target) : null;
  if (!target) err('target', 'The target designation is missing.');
  else if (designation?.problem) err('target', designation.problem);

  const quantityText = raw.fixed?.quantity ?? text('quantity').toLowerCase();
  const kind = (FILE_QUANTITIES as readonly string[]).includes(quantityText) ? (quantityText as FileQuantity) : null;
  if (!quantityText) err('quantity', 'The quantity is missing.');
  else if (!kind) err('quantity', `Unknown quantity "${quantityText}"; use one of ${FILE_QUANTITIES.join(', ')}.`);

  let value: number | null = null;
  if (!text('value')) err('value', 'The value is missing.');
  else {
    const r = readNumber(text('value'), 'the value');
    if (r.ok) value = r.value;
    else err('value', r.message);
  }

  let uncertainty: number | null = null;
  if (text('uncertainty')) {
    const r = readNumber(text('uncertainty'), 'the uncertainty');
    if (!r.ok) err('uncertainty', r.message);
    else if (r.value < 0) err('uncertainty', `The uncertainty must be 0 or more (got ${r.value}).`);
    else uncertainty = r.value;
  }

  const unit = raw.fixed?.unit ?? text('unit');
  const band = raw.fixed?.band ?? (text('band') ? normaliseBand(text('band')) : '');
  if (kind && NEEDS_BAND.has(kind) && !band) err('band', `A ${kind} needs its band (for example V, or B-V for a colour index).`);
  if (kind === 'colour_index' && band && !/^[A-Za-z]+-[A-Za-z]+$/.test(band)) err('band', `A colour index band is two bands with a hyphen, like B-V (got "${band}").`);
  if (band.length > MAX_LENGTH.band) err('band', `A band is at most ${MAX_LENGTH.band} characters (this one has ${band.length}).`);
  if (text('instrument').length > MAX_LENGTH.instrument) err('instrument', `An instrument is at most ${MAX_LENGTH.instrument} characters (this one has ${text('instrument').length}).`);

  let restValue: number | null = raw.fixed?.restWavelength ?? null;
  if (restValue === null && text('rest_wavelength')) {
    const r = readNumber(text('rest_wavelength'), 'the rest wavelength');
    if (r.ok) restValue = r.value;
    else err('rest_wavelength', r.message);
  }
  if (kind && NEEDS_REST_WAVELENGTH.has(kind)) {
    if (restValue === null && !text('rest_wavelength')) err('rest_wavelength', `A ${kind} needs the line's rest wavelength, in the same unit as the value.`);
    else if (restValue !== null && restValue <= 0) err('rest_wavelength', `The rest wavelength must be positive (got ${restValue}).`);
  }

  let landeG: number | null = raw.fixed?.landeG ?? null;
  if (landeG === null && text('lande_g')) {
    const r = readNumber(text('lande_g'), 'the Landé g factor');
    if (r.ok) landeG = r.value;
    else err('lande_g', r.message);
  }
  if (kind === 'zeeman_separation' && landeG === null && !text('lande_g')) err('lande_g', 'A zeeman_separation needs the line’s Landé g factor.');
  if (landeG !== null && landeG <= 0) err('lande_g', `The Landé g factor must be positive (got ${landeG}).`);

  let observedAt: string | null = null;
  if (text('observed_at')) {
    const t = text('observed_at');
    observedAt = cache.time(t);
    if (observedAt === null) err('observed_at', `observed_at must be an ISO 8601 time in UTC, like 2026-11-30T22:14:05Z (got "${t}").`);
  }

  let raDeg: number | null = null;
  let decDeg: number | null = null;
  if (text('ra')) {
    const r = parseRightAscension(text('ra'));
    if (r.ok) raDeg = r.degrees;
    else err('ra', r.message);
  }
  if (text('dec')) {
    const r = parseDeclination(text('dec'));
    if (r.ok) decDeg = r.degrees;
    else err('dec', r.message);
  }
  if ((raDeg === null) !== (decDeg === null) && errors.length === before) err(raDeg === null ? 'ra' : 'dec', 'Give both ra and dec, or neither.');

  let si: { valueSi: number; uncertaintySi: number; unitSi: string } | null = null;
  let restSi: number | null = null;
  if (kind && value !== null) {
    if (MUST_BE_POSITIVE.has(kind) && value <= 0) err('value', `A ${kind} must be positive (got ${value}).`);
    if (MUST_NOT_BE_NEGATIVE.has(kind) && value < 0) err('value', `A ${kind} must be 0 or more (got ${value}); 0 means nothing was detected.`);
    try {
      si = measurementToSi(kind, value, unit, uncertainty ?? 0);
      if (restValue !== null) restSi = measurementToSi(kind, restValue, unit, 0).valueSi;
    } catch (e) {
      if (!(e instanceof PhysicsError)) throw e;
      err('unit', unit ? `${e.message}.` : `A ${kind} needs a unit; use one of the units allowed for it.`);
    }
  }

  if (errors.length > before || !kind || value === null || !si) return null;
  return {
    row: raw.row,
    target,
    targetKey: designation!.key,
    raDeg,
    decDeg,
    kind,
    value,
    uncertainty,
    unit: unit || null,
    valueSi: si.valueSi,
    uncertaintySi: uncertainty === null ? null : si.uncertaintySi,
    unitSi: si.unitSi,
    band: band || null,
    restWavelengthSi: restSi,
    landeG,
    observedAt,
    instrument: text('instrument') || null,
    note: raw.cells.note?.text ?? '',
    extra: raw.extra,
  };
}

function duplicateKey(r: NormalisedRow): string {
  return JSON.stringify([r.targetKey, r.kind, r.band, r.valueSi, r.uncertaintySi, r.restWavelengthSi, r.landeG, r.observedAt, r.instrument]);
}

/**
 * Reads every record of a file under a mapping. `records` excludes the
 * header; the first record is row 2. Rows that repeat an earlier row
 * exactly are errors that name the earlier row.
 */
export function readMeasurementRecords(headers: string[], records: string[][], mapping: ColumnMapping): { rows: NormalisedRow[]; errors: RowError[] } {
  const errors = checkMapping(headers, mapping);
  if (errors.length) return { rows: [], errors };
  const rows: NormalisedRow[] = [];
  const seen = new Map<string, number>();
  const cache = new ReadCache();
  records.forEach((record, i) => {
    const rowNumber = i + 2;
    if (record.length > headers.length && record.slice(headers.length).some((c) => c.trim() !== '')) {
      errors.push({ row: rowNumber, column: '', message: `Row has ${record.length} cells but the header has ${headers.length}.` });
      return;
    }
    for (const raw of toRawMeasurements(headers, record, rowNumber, mapping)) {
      const row = normalise(raw, errors, cache);
      if (!row) continue;
      const key = duplicateKey(row);
      const first = seen.get(key);
      if (first !== undefined) {
        errors.push({ row: rowNumber, column: raw.cells.value?.column ?? 'value', message: `This measurement repeats row ${first}.` });
        continue;
      }
      seen.set(key, rowNumber);
      rows.push(row);
    }
  });
  return { rows, errors };
}

/** The two templates offered for download. */
export const LONG_TEMPLATE = [
  'target,ra,dec,quantity,value,uncertainty,unit,band,rest_wavelength,lande_g,observed_at,instrument,note',
  'GW 201,05 14 32.3,-08 12 05,magnitude,7.42,0.02,mag,V,,,2026-11-30T22:14:05Z,CCD-1,',
  'GW 201,,,colour_index,0.65,0.03,mag,B-V,,,2026-11-30T22:14:05Z,CCD-1,',
  'GW 201,,,parallax,41.2,0.4,mas,,,,,,catalogue value',
  'GW 201,,,line_wavelength,656.301,0.004,nm,,656.279,,2026-11-30T23:02:11Z,echelle,H-alpha',
  '',
].join('\n');

export const WIDE_TEMPLATE = [
  'target,ra,dec,observed_at,V,V_err,B_V,B_V_err,E_B_V,parallax_mas,parallax_mas_err,instrument',
  'GW 201,05 14 32.3,-08 12 05,2026-11-30T22:14:05Z,7.42,0.02,0.65,0.03,0.02,41.2,0.4,CCD-1',
  '',
].join('\n');
