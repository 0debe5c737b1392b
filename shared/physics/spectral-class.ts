import { dwarfColumnSlope, interpolateDwarfColumn } from './dwarf-table';
import { PhysicsError } from './errors';
import type { Measured } from './measured';
import { DWARF_SEQUENCE, type DwarfSequenceRow } from './tables/dwarf-sequence';

/**
 * Spectral class and subclass from effective temperature, read from the mean
 * dwarf sequence. Temperature alone carries no luminosity class: the label is
 * the class (e.g. "G2"); `dwarfType` names the dwarf-table row it matches
 * (e.g. "G2V"). The table's own boundaries are used (A9V 7400 K, F0V 7220 K),
 * not the coarse ones in common use.
 */

const LETTERS = ['O', 'B', 'A', 'F', 'G', 'K', 'M'] as const;

/**
 * Continuous spectral index of a type such as "G2V" or "O9.5V": ten per
 * class, O0 = 0, B0 = 10, A0 = 20, F0 = 30, G0 = 40, K0 = 50, M0 = 60.
 * Throws PhysicsError('out_of_range') for a type it cannot read.
 * @see Morgan & Keenan's O B A F G K M sequence with decimal subclasses (from memory)
 */
export function spectralIndexOfType(spectralType: string): number {
  const match = /^([OBAFGKM])(\d+(?:\.\d+)?)/.exec(spectralType.trim());
  if (!match) throw new PhysicsError('out_of_range', 'spectral_class', `cannot read spectral type "${spectralType}"`);
  return LETTERS.indexOf(match[1] as (typeof LETTERS)[number]) * 10 + Number(match[2]);
}

const INDEX_OF_ROW = new Map<DwarfSequenceRow, number>(DWARF_SEQUENCE.map((row) => [row, spectralIndexOfType(row.spectralType)]));
const indexColumn = (row: DwarfSequenceRow): number => INDEX_OF_ROW.get(row) as number;
/** The rows' indices in table order, for the search for the nearest type. */
const INDEX_BY_ROW = DWARF_SEQUENCE.map(indexColumn);

/** A spectral class read from the dwarf table. */
export interface SpectralClass {
  /** Continuous index (see spectralIndexOfType). */
  readonly index: number;
  /** Class and subclass of the nearest table type, e.g. "G2". */
  readonly label: string;
  /** The nearest dwarf-table row, e.g. "G2V". */
  readonly dwarfType: string;
}

/**
 * Continuous spectral index (see spectralIndexOfType) at an effective
 * temperature in K, linear in log T between the dwarf table's rows. Throws
 * PhysicsError('out_of_range') outside 2330–45900 K.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function spectralIndexFromTemperature(temperatureK: number): number {
  return interpolateDwarfColumn(temperatureK, indexColumn, 'spectral_class');
}

/**
 * Spectral class from effective temperature in K: the index is interpolated
 * linearly in log T between table rows, and the label is the table type
 * nearest that index. Throws PhysicsError('out_of_range') outside 2330–45900 K.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function spectralClassFromTemperature(temperatureK: number): SpectralClass {
  const index = spectralIndexFromTemperature(temperatureK);
  const nearest = nearestRow(index);
  return { index, label: nearest.spectralType.replace(/V$/, ''), dwarfType: nearest.spectralType };
}

/** The dwarf-table row whose type is nearest a spectral index; an index past either end reads the end row. */
function nearestRow(index: number): DwarfSequenceRow {
  let nearest = 0;
  for (let row = 0; row < INDEX_BY_ROW.length; row++) {
    if (Math.abs(INDEX_BY_ROW[row] - index) < Math.abs(INDEX_BY_ROW[nearest] - index)) nearest = row;
  }
  return DWARF_SEQUENCE[nearest];
}

/**
 * Class and subclass (e.g. "G1") of the tabulated type nearest a spectral
 * index, for printing the ends of an index's 1σ range.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function spectralTypeNearIndex(index: number): string {
  return nearestRow(index).spectralType.replace(/V$/, '');
}

/**
 * Spectral class with the first-order uncertainty of its index, from a
 * temperature in K with its σ: σ_index = |d index / d log T| σ_T / (T ln 10).
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function spectralClass(temperatureK: Measured): SpectralClass & { readonly indexSigma: number } {
  const cls = spectralClassFromTemperature(temperatureK.value);
  const slope = dwarfColumnSlope(temperatureK.value, indexColumn, 'spectral_class');
  const indexSigma = Math.abs(slope) * (temperatureK.sigma / (temperatureK.value * Math.LN10));
  return { index: cls.index, label: cls.label, dwarfType: cls.dwarfType, indexSigma };
}
