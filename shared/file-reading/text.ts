import Papa from 'papaparse';

/**
 * The one home of reading an upload: this file turns bytes into a table,
 * measurement-file.ts reads a table of measurements under a column mapping,
 * spectrum.ts reads a spectrum; the rules of what each kind needs are
 * shared/physics/measurement-rules.ts and the units shared/physics/units.ts.
 */

/** A file that cannot be read as a table at all; the message says what to do about it. */
export class UnreadableFile extends Error {
  override name = 'UnreadableFile';
}

export interface CsvTable {
  headers: string[];
  records: string[][];
  delimiter: string;
}

/**
 * Turns the uploaded bytes into text: UTF-8 with or without a byte-order
 * mark, or UTF-16 with its mark (what spreadsheets write as "Unicode text").
 * Anything else with NUL bytes, or invalid UTF-8, is not a CSV file we can
 * read, and the message says so instead of importing garbage.
 */
export function decodeText(bytes: Buffer): string {
  if (bytes.length === 0) throw new UnreadableFile('The file is empty.');
  const utf16 = bytes[0] === 0xff && bytes[1] === 0xfe ? 'utf-16le' : bytes[0] === 0xfe && bytes[1] === 0xff ? 'utf-16be' : null;
  if (utf16) {
    try {
      return new TextDecoder(utf16, { fatal: true }).decode(bytes);
    } catch {
      throw new UnreadableFile('The file starts like UTF-16 text but is not valid UTF-16. Save it as CSV UTF-8.');
    }
  }
  if (bytes.subarray(0, Math.min(bytes.length, 8192)).includes(0)) {
    throw new UnreadableFile('This is not a text CSV file (it contains binary data). Export it from your spreadsheet as CSV, UTF-8.');
  }
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    throw new UnreadableFile('The file is not UTF-8 text. Save it as CSV UTF-8 and upload it again.');
  }
}

/** Parses CSV text, detecting the delimiter (comma, semicolon or tab) and the line ends. */
export function parseCsv(text: string): CsvTable {
  const result = Papa.parse<string[]>(text, {
    delimitersToGuess: [',', ';', '\t'],
    skipEmptyLines: 'greedy',
    header: false,
  });
  const [headerRow, ...records] = result.data;
  if (!headerRow || headerRow.every((h) => h.trim() === '')) {
    throw new UnreadableFile('The file is empty.');
  }
  const headers = headerRow.map((h) => h.replace(/^\uFEFF/, '').trim());
  const blank = headers.findIndex((h) => h === '');
  if (blank >= 0) throw new UnreadableFile(`Column ${blank + 1} of the header row has no name.`);
  const dup = headers.find((h, i) => headers.findIndex((o) => o.toLowerCase() === h.toLowerCase()) !== i);
  if (dup) throw new UnreadableFile(`The header names the column "${dup}" twice.`);
  if (records.length === 0) throw new UnreadableFile('The file has a header row but no data rows.');
  return { headers, records, delimiter: result.meta.delimiter };
}
