/**
 * CSV cells and documents (RFC 4180) that are safe to open in a spreadsheet.
 * Used by every CSV export of the app, client and server.
 */

export type CsvCell = string | number | boolean | Date | null | undefined;

// Spreadsheets run a text cell beginning with one of these as a formula (OWASP "CSV Injection"),
// full-width forms included because some spreadsheets fold them to ASCII.
const FORMULA_START = /^[=+\-@\t\r\uFF1D\uFF0B\uFF0D\uFF20]/;

/**
 * One CSV cell: finite numbers as written; text that a spreadsheet would read as a
 * formula gets a leading apostrophe; cells with a comma, quote or line break are quoted.
 * Null, undefined and non-finite numbers give an empty cell; dates their ISO 8601 form.
 */
export function csvCell(value: CsvCell): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  const raw = value instanceof Date ? value.toISOString() : value;
  const text = FORMULA_START.test(raw) ? `'${raw}` : raw;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A CSV document with CRLF line ends: the header, then one line per row. */
export function toCsv(header: string[], rows: CsvCell[][]): string {
  return [header, ...rows].map((r) => r.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
