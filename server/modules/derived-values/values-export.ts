import { QUANTITY_IDS, QUANTITY_SI_UNIT, type QuantityId } from '../../../shared/physics/quantities';
import { neutraliseCell, toCsv } from '../../lib/csv';
import type { ExportTarget } from './derived-values.repository';

/**
 * The project's values as a table, one row per target, written as CSV or as
 * a VOTable 1.4 document (IVOA Recommendation 2019-10-21). Values are in the
 * SI units they are stored in (shared/physics/quantities.ts), so nothing is
 * rounded or converted on the way out; the VOTable names each unit in VOUnit
 * syntax (IVOA VOUnits 1.0) and each column's meaning with a UCD from the
 * UCD1+ controlled vocabulary (IVOA). The UCD choices below are from memory
 * of that vocabulary.
 */

type Datatype = 'char' | 'double' | 'int';

export interface ExportColumn {
  name: string;
  datatype: Datatype;
  /** VOUnit string; absent for dimensionless and text columns. */
  unit?: string;
  ucd: string;
  description: string;
  cell: (t: ExportTarget) => string;
}

/** VOUnit spelling of each stored SI unit ('1', a pure number, has none). */
const VO_UNIT: Record<string, string | undefined> = {
  K: 'K',
  '1': undefined,
  'W/m2': 'W.m**-2',
  m: 'm',
  W: 'W',
  dex: 'dex',
  mag: 'mag',
  'm/s': 'm.s**-1',
  T: 'T',
};

/** What each derived quantity means, as a UCD (from memory of UCD1+), and in words. */
const QUANTITY_META: Record<QuantityId, { ucd: string; words: string }> = {
  temperature_wien: { ucd: 'phys.temperature.effective', words: "temperature from Wien's displacement law" },
  temperature_colour: { ucd: 'phys.temperature.effective', words: 'temperature from the dereddened colour index' },
  temperature_planck: { ucd: 'phys.temperature.effective', words: 'temperature of the Planck fit to the spectrum' },
  temperature: { ucd: 'phys.temperature.effective', words: 'adopted effective temperature' },
  spectral_class: { ucd: 'meta.code.class;src.spType', words: 'spectral class as a continuous index (O0 = 0, B0 = 10, … M0 = 60; G2 = 42)' },
  bolometric_flux: { ucd: 'phot.flux.bol', words: 'bolometric flux at the telescope' },
  distance_parallax: { ucd: 'pos.distance', words: 'distance from the trigonometric parallax' },
  luminosity: { ucd: 'phys.luminosity', words: 'luminosity from flux and distance' },
  radius: { ucd: 'phys.size.radius', words: 'radius from the Stefan–Boltzmann law' },
  luminosity_class: { ucd: 'phys.luminosity;arith.ratio', words: 'offset from the main sequence, log10(L / L_MS(T))' },
  luminosity_hr: { ucd: 'phys.luminosity', words: 'luminosity read from the main-sequence relation' },
  distance_photometric: { ucd: 'pos.distance', words: 'photometric distance (distance modulus)' },
  absolute_bolometric_magnitude: { ucd: 'phys.magAbs.bol', words: 'absolute bolometric magnitude' },
  radial_velocity: { ucd: 'spect.dopplerVeloc', words: 'radial velocity from the Doppler shift of a line' },
  rotation_velocity: { ucd: 'phys.veloc.rotat', words: 'equatorial rotation velocity (v sin i) from limb separation' },
  magnetic_field: { ucd: 'phys.magField', words: 'magnetic field strength from Zeeman splitting' },
};

/** Quantities whose stored value comes with a label astronomers read first (the class itself). */
const LABEL_UCD: Partial<Record<QuantityId, string>> = {
  spectral_class: 'src.spType',
  luminosity_class: 'src.class.luminosity',
};

/** Shortest text that reads back to the same double; empty for no value. */
function number(n: number | null | undefined): string {
  return n === null || n === undefined || !Number.isFinite(n) ? '' : String(n);
}

function quantityColumns(q: QuantityId): ExportColumn[] {
  const unit = VO_UNIT[QUANTITY_SI_UNIT[q]];
  const { ucd, words } = QUANTITY_META[q];
  const get = (t: ExportTarget) => t.values.get(q);
  const columns: ExportColumn[] = [
    { name: q, datatype: 'double', unit, ucd, description: `${words}, ${QUANTITY_SI_UNIT[q] === '1' ? 'a pure number' : `in ${QUANTITY_SI_UNIT[q]}`}`, cell: (t) => number(get(t)?.value) },
    { name: `${q}_sigma`, datatype: 'double', unit, ucd: `stat.error;${q === 'spectral_class' ? 'src.spType' : ucd.split(';')[0]}`, description: `1-sigma uncertainty of ${q}`, cell: (t) => number(get(t)?.uncertainty) },
  ];
  const labelUcd = LABEL_UCD[q];
  if (labelUcd) columns.push({ name: `${q}_label`, datatype: 'char', ucd: labelUcd, description: `${q} as astronomers write it`, cell: (t) => get(t)?.label ?? '' });
  columns.push(
    { name: `${q}_status`, datatype: 'char', ucd: 'meta.code.status', description: `review status of ${q}: approved or proposed`, cell: (t) => get(t)?.status ?? '' },
    { name: `${q}_revision`, datatype: 'int', ucd: 'meta.version', description: `revision number of ${q}`, cell: (t) => (get(t) ? String(get(t)!.revision) : '') },
  );
  return columns;
}

/** Every column of the export, in order: the target, then each quantity in derivation-table order. */
export const exportColumns: readonly ExportColumn[] = [
  { name: 'designation', datatype: 'char', ucd: 'meta.id;meta.main', description: 'target designation', cell: (t) => t.designation },
  { name: 'ra', datatype: 'double', unit: 'deg', ucd: 'pos.eq.ra;meta.main', description: 'right ascension, J2000, degrees', cell: (t) => number(t.raDeg) },
  { name: 'dec', datatype: 'double', unit: 'deg', ucd: 'pos.eq.dec;meta.main', description: 'declination, J2000, degrees', cell: (t) => number(t.decDeg) },
  ...QUANTITY_IDS.flatMap(quantityColumns),
];

export async function* csvChunks(batches: AsyncIterable<ExportTarget[]>): AsyncGenerator<string> {
  yield toCsv([exportColumns.map((c) => c.name)]);
  // Only text is neutralised: a number such as -12.5 is no formula, and a quote would stop it reading as a number.
  for await (const batch of batches) yield toCsv(batch.map((t) => exportColumns.map((c) => (c.datatype === 'char' ? neutraliseCell(c.cell(t)) : c.cell(t)))));
}

// XML 1.0 allows tab, LF, CR and everything from U+0020 on, less the surrogates and U+FFFE/U+FFFF.
// eslint-disable-next-line no-control-regex
const NOT_XML = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

/** Text safe inside an element or a double-quoted attribute. */
export function xmlEscape(text: string): string {
  return text
    .replace(NOT_XML, '\uFFFD')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;')
    .replace(/\r/g, '&#13;')
    .replace(/\n/g, '&#10;')
    .replace(/\t/g, '&#9;');
}

function attributes(attrs: Record<string, string | undefined>): string {
  return Object.entries(attrs)
    .filter(([, v]) => v !== undefined)
    .map(([k, v]) => ` ${k}="${xmlEscape(v!)}"`)
    .join('');
}

export interface VotableHeading {
  projectCode: string;
  projectName: string;
  include: 'approved' | 'proposed';
  exportedAt: Date;
}

const VOTABLE_NS = 'http://www.ivoa.net/xml/VOTable/v1.3';

function field(c: ExportColumn): string {
  const ref = c.name === 'ra' || c.name === 'dec' ? 'J2000' : undefined;
  return `      <FIELD${attributes({ name: c.name, ID: c.name, datatype: c.datatype, arraysize: c.datatype === 'char' ? '*' : undefined, unit: c.unit, ucd: c.ucd, ref })}>\n        <DESCRIPTION>${xmlEscape(c.description)}</DESCRIPTION>\n      </FIELD>\n`;
}

function row(t: ExportTarget): string {
  // An empty TD is a null cell, for numbers as for text (VOTable 1.3 onwards).
  return `        <TR>${exportColumns.map((c) => `<TD>${xmlEscape(c.cell(t))}</TD>`).join('')}</TR>\n`;
}

/**
 * A VOTable 1.4 document. VOTable 1.4 keeps the 1.3 namespace (the standard
 * says so; quoted from memory), so the version attribute says 1.4 and the
 * namespace says v1.3.
 */
export async function* votableChunks(batches: AsyncIterable<ExportTarget[]>, heading: VotableHeading): AsyncGenerator<string> {
  const held = heading.include === 'approved' ? 'approved values only' : 'approved values and the newest proposed revisions not yet reviewed';
  yield [
    '<?xml version="1.0" encoding="UTF-8"?>\n',
    `<VOTABLE version="1.4" xmlns="${VOTABLE_NS}" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="${VOTABLE_NS} http://www.ivoa.net/xml/VOTable/votable-1.4.xsd">\n`,
    `  <DESCRIPTION>${xmlEscape(`Derived stellar values of the project ${heading.projectName} (${heading.projectCode}), one row per target; ${held}. Values are in SI units as stored (temperatures K, luminosities W, radii and distances m, velocities m/s, fields T).`)}</DESCRIPTION>\n`,
    `  <INFO${attributes({ name: 'project', value: heading.projectCode })}>${xmlEscape(heading.projectName)}</INFO>\n`,
    `  <INFO${attributes({ name: 'exported', value: heading.exportedAt.toISOString() })}>Time of the export, UTC</INFO>\n`,
    `  <INFO${attributes({ name: 'include', value: heading.include })}>${xmlEscape(held)}</INFO>\n`,
    '  <RESOURCE type="results">\n',
    '    <COOSYS ID="J2000" system="eq_FK5" equinox="J2000"/>\n',
    `    <TABLE${attributes({ name: `${heading.projectCode}_values` })}>\n`,
    `      <DESCRIPTION>${xmlEscape(`One row per target of ${heading.projectCode}; for each derived quantity its value, 1-sigma uncertainty, review status and revision. An empty cell: the target has no such value.`)}</DESCRIPTION>\n`,
    ...exportColumns.map(field),
    '      <DATA>\n',
    '       <TABLEDATA>\n',
  ].join('');
  for await (const batch of batches) yield batch.map(row).join('');
  yield '       </TABLEDATA>\n      </DATA>\n    </TABLE>\n  </RESOURCE>\n</VOTABLE>\n';
}
