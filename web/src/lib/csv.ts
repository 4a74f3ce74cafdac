/**
 * CSV export of what is on screen. Quotes every field that needs it (RFC 4180) and starts with a
 * byte-order mark so spreadsheet programs read the units (`N·s/m`, `°`) correctly.
 */

export type CsvValue = string | number | boolean | null | undefined;

function field(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  const s = String(value);
  // Guard against formula injection when the file is opened in a spreadsheet.
  const safe = /^[=+\-@\t\r]/.test(s) && typeof value === 'string' ? `'${s}` : s;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

export function toCsv(header: string[], rows: CsvValue[][]): string {
  return '\ufeff' + [header, ...rows].map((r) => r.map(field).join(',')).join('\r\n') + '\r\n';
}

export function downloadCsv(fileName: string, csv: string) {
  const blob = new Blob([csv], { type: 'text/csv;charset=utf-8' });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
