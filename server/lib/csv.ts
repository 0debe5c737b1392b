import Papa from 'papaparse';

/**
 * A spreadsheet runs a cell that begins with =, +, -, @, a tab or a carriage
 * return as a formula (OWASP, "CSV Injection"). A leading single quote makes
 * it text in every common spreadsheet, and is visible to anyone reading the
 * file, so nothing is silently changed. Every CSV the server writes passes
 * its cells through here.
 */
export function neutraliseCell(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/** RFC 4180: CRLF between records, fields quoted when they hold a comma, a quote or a line break. */
export function toCsv(rows: string[][]): string {
  return Papa.unparse(rows, { newline: '\r\n', header: false }) + '\r\n';
}
