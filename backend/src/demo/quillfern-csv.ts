import type { QuillfernExport } from './quillfern';

function csvField(value: string | number | null): string {
  if (value === null) return '';
  const text = String(value);
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The export as UTF-8 CSV (comma separated, ISO dates). */
export function quillfernCsv(data: QuillfernExport): string {
  const lines = [data.header.map(csvField).join(',')];
  for (const row of data.rows) lines.push(row.map(csvField).join(','));
  return `${lines.join('\r\n')}\r\n`;
}
