/**
 * CSV for spreadsheets (RFC 4180): every field quoted, quotes doubled, CRLF between records. A leading
 * = + - @ (or tab / CR) gets a ' in front so a spreadsheet does not run a cell as a formula.
 */
export function csvField(value: unknown): string {
  let text = value === null || value === undefined ? '' : Array.isArray(value) ? value.join('; ') : String(value);
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return `"${text.replace(/"/g, '""')}"`;
}

export function toCsv(header: readonly string[], rows: readonly (readonly unknown[])[]): string {
  return [header, ...rows].map((row) => row.map(csvField).join(',')).join('\r\n') + '\r\n';
}

/** Offer a CSV as a download. The BOM makes spreadsheet programs read it as UTF-8. */
export function downloadCsv(filename: string, csv: string): void {
  const blob = new Blob(['\uFEFF', csv], { type: 'text/csv;charset=utf-8' });
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  document.body.append(link);
  link.click();
  link.remove();
  // Some browsers start the download after the click handler returns.
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
