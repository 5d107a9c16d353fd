/**
 * CSV cells for files people open in spreadsheets. A text cell that a spreadsheet would run as a
 * formula (starting with =, +, -, @, tab or carriage return) is prefixed with an apostrophe
 * (the OWASP "CSV injection" advice); numbers are written as numbers.
 */
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (value instanceof Date) return value.toISOString();
  let s = String(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  if (/[",\r\n']/.test(s)) s = `"${s.replace(/"/g, '""')}"`;
  return s;
}

export function csvLine(cells: unknown[]): string {
  return cells.map(csvCell).join(',') + '\r\n';
}
