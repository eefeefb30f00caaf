import { type Cell, type IntakeLimits, type RawTable, tableFromGrid } from './build-table';
import { createRowProblems, IntakeError } from './intake-error';
import { scanCsv, UnclosedQuoteError } from './scan-csv';

export type Delimiter = ',' | ';' | '\t';
const CANDIDATES: Delimiter[] = [',', ';', '\t'];
const DELIMITER_NAMES: Record<Delimiter, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

/** Counts each candidate delimiter per line, outside quoted values, over the start of the file. */
export function detectDelimiter(text: string): Delimiter {
  const sample = text.slice(0, 65_536);
  const lines: Record<Delimiter, number>[] = [];
  let counts: Record<Delimiter, number> = { ',': 0, ';': 0, '\t': 0 };
  let quoted = false;
  let blank = true;
  for (let i = 0; i < sample.length && lines.length < 50; i += 1) {
    const ch = sample[i];
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === '\n' || ch === '\r')) {
      if (!blank) lines.push(counts);
      counts = { ',': 0, ';': 0, '\t': 0 };
      blank = true;
    } else if (!quoted && (ch === ',' || ch === ';' || ch === '\t')) {
      counts[ch] += 1;
      blank = false;
    } else if (ch.trim() !== '') blank = false;
  }
  if (!blank && lines.length < 50) lines.push(counts);
  if (lines.length === 0) return ',';

  const header = lines[0];
  let best: Delimiter = ',';
  let bestScore = -1;
  for (const candidate of CANDIDATES) {
    if (header[candidate] === 0) continue;
    // The delimiter appears as often on the other lines as in the header line.
    const consistent = lines.filter((line) => line[candidate] === header[candidate]).length;
    const score = consistent * 1000 + header[candidate];
    if (score > bestScore) {
      best = candidate;
      bestScore = score;
    }
  }
  return best;
}

/** Parses CSV text (already decoded) into a table; rejects unbalanced quotes and over-long rows. */
export function parseCsv(text: string, limits: IntakeLimits, warnings: string[] = []): RawTable {
  const delimiter = detectDelimiter(text);
  let records: string[][];
  try {
    records = scanCsv(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text, delimiter);
  } catch (error) {
    if (!(error instanceof UnclosedQuoteError)) throw error;
    const row = error.record;
    const reason = 'a quoted value starts here and its closing quote (") is missing';
    throw new IntakeError(
      'csv_unbalanced_quotes',
      422,
      `Row ${row} opens a quoted value that is never closed, so the rest of the file cannot be read. Fix the quote in that row (or re-export the file) and upload again.`,
      { rows: [{ row, reason }], count: 1 },
    );
  }

  if (records.length > limits.maxRows + 1_000) {
    throw new IntakeError(
      'too_many_rows',
      413,
      `The file has more than ${limits.maxRows} rows. Split the export and upload the parts as separate datasets.`,
      { limit: limits.maxRows },
    );
  }

  const isBlank = (record: string[]) => record.every((value) => value.trim() === '');
  const headerIndex = records.findIndex((record) => !isBlank(record));
  if (headerIndex < 0) {
    throw new IntakeError(
      'file_empty',
      422,
      'The file has no data in it. Export the staff list again and upload it.',
    );
  }
  let width = records[headerIndex].length;
  while (width > 1 && records[headerIndex][width - 1].trim() === '') width -= 1;
  if (width > limits.maxColumns) {
    throw new IntakeError(
      'too_many_columns',
      413,
      `The file has ${width} columns; the limit is ${limits.maxColumns}. Remove columns you do not need and upload again.`,
      { columns: width, limit: limits.maxColumns },
    );
  }

  const problems = createRowProblems();
  for (let r = headerIndex + 1; r < records.length; r += 1) {
    const record = records[r];
    if (record.length > width && record.slice(width).some((value) => value.trim() !== '')) {
      problems.add({
        row: r + 1,
        reason: `has ${record.length} values but the header has ${width} columns (check the ${DELIMITER_NAMES[delimiter]}s and quotes in this row)`,
      });
    }
  }
  if (problems.count > 0) {
    throw new IntakeError(
      'rows_invalid',
      422,
      `${problems.count} row(s) have more values than the header has columns. Fix them and upload again; nothing was stored.`,
      problems.details(),
    );
  }

  const grid: Cell[][] = Array.from({ length: width }, () => new Array<Cell>(records.length));
  for (let r = 0; r < records.length; r += 1) {
    const record = records[r];
    for (let c = 0; c < width; c += 1) grid[c][r] = record[c] ?? null;
  }
  if (delimiter !== ',') warnings.push(`The values are separated by ${DELIMITER_NAMES[delimiter]}s.`);
  return tableFromGrid(grid, records.length, limits, { warnings, decimalComma: delimiter === ';' });
}
