/**
 * Command line for analysts' batch runs and outside checks:
 *   tree fit --data FILE.csv --target COLUMN [--positive VALUE] [--criterion gini|entropy]
 *            [--max-depth N] [--min-leaf N] [--k N] [--exclude a,b] [--seed N]
 *            [--pruning none|cv] [--folds N] [--max-bins N] --model OUT.json
 *   tree predict --model M.json --data FILE.csv [--out P.csv]
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'csv-parse/sync';
import { type TreeNode, treeNodeSchema } from '../../../shared/tree.js';
import { buildTable, type ColumnInput, categoricalColumn, numericColumn, type Table } from './table.js';
import { type TrainOptions, trainModel } from './train.js';
import { predict } from './tree-json.js';

export const MODEL_FORMAT = 'coppice-tree-model';

export type ModelFile = {
  format: typeof MODEL_FORMAT;
  version: 1;
  target: string;
  positiveValue: string;
  features: Array<{ name: string; kind: 'numeric' | 'categorical' }>;
  root: TreeNode;
  [more: string]: unknown;
};

class UsageError extends Error {}

function parseArgs(args: string[]): Map<string, string> {
  const options = new Map<string, string>();
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (!arg.startsWith('--')) throw new UsageError(`Unexpected argument "${arg}"`);
    const value = args[i + 1];
    if (value === undefined || value.startsWith('--')) throw new UsageError(`${arg} needs a value`);
    options.set(arg.slice(2), value);
    i++;
  }
  return options;
}

function required(options: Map<string, string>, name: string): string {
  const value = options.get(name);
  if (value === undefined) throw new UsageError(`--${name} is required`);
  return value;
}

function integer(options: Map<string, string>, name: string): number | undefined {
  const value = options.get(name);
  if (value === undefined) return undefined;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0) throw new UsageError(`--${name} must be a whole number, not "${value}"`);
  return n;
}

/** Header row plus cells; empty cells are missing. */
export function readCsv(path: string): { header: string[]; rows: string[][] } {
  const records: string[][] = parse(readFileSync(path), {
    bom: true,
    skip_empty_lines: true,
    relax_column_count: false,
  });
  if (records.length === 0) throw new UsageError(`${path} is empty`);
  const [header, ...rows] = records;
  return { header: header.map((h) => h.trim()), rows };
}

const isNumber = (cell: string) => cell.trim() !== '' && Number.isFinite(Number(cell));

function column(
  header: string[],
  rows: string[][],
  name: string,
  kind?: 'numeric' | 'categorical',
): ColumnInput {
  const j = header.indexOf(name);
  if (j < 0) throw new UsageError(`The data has no column "${name}"`);
  const cells = rows.map((r) => (r[j] ?? '').trim());
  const numeric = kind ? kind === 'numeric' : cells.every((c) => c === '' || isNumber(c));
  return numeric
    ? { name, kind: 'numeric', values: cells.map((c) => (isNumber(c) ? Number(c) : null)) }
    : { name, kind: 'categorical', values: cells.map((c) => (c === '' ? null : c)) };
}

function fitCommand(options: Map<string, string>): string {
  const { header, rows } = readCsv(required(options, 'data'));
  const target = required(options, 'target');
  const modelPath = required(options, 'model');
  if (!header.includes(target)) throw new UsageError(`The target column "${target}" is not in the data`);
  const exclude = (options.get('exclude') ?? '')
    .split(',')
    .map((s) => s.trim())
    .filter(Boolean);
  const unknown = exclude.filter((e) => !header.includes(e));
  if (unknown.length > 0) throw new UsageError(`--exclude names unknown columns: ${unknown.join(', ')}`);

  const t = header.indexOf(target);
  const positiveOption = options.get('positive');
  const isPositive = (cell: string) =>
    positiveOption !== undefined
      ? cell.trim() === positiveOption
      : ['1', 'yes', 'true'].includes(cell.trim().toLowerCase());
  const label = rows.map((r) => (isPositive(r[t] ?? '') ? 1 : 0));
  const positives = label.reduce<number>((a, b) => a + b, 0);
  if (positives === 0 || positives === label.length) {
    throw new UsageError(
      `The target "${target}" has only one class (${positives} of ${label.length} rows positive); use --positive to say which value counts`,
    );
  }
  const featureNames = header.filter((h) => h !== target && !exclude.includes(h));
  const table = buildTable(featureNames.map((name) => column(header, rows, name)));
  const criterion = options.get('criterion') ?? 'gini';
  if (criterion !== 'gini' && criterion !== 'entropy')
    throw new UsageError('--criterion must be gini or entropy');
  const pruning = options.get('pruning') ?? 'none';
  if (pruning !== 'none' && pruning !== 'cv') throw new UsageError('--pruning must be none or cv');
  const trainOptions: TrainOptions = {
    criterion,
    maxDepth: integer(options, 'max-depth') ?? 6,
    minLeaf: integer(options, 'min-leaf') ?? 1,
    k: integer(options, 'k') ?? 1,
    seed: integer(options, 'seed') ?? 1,
    folds: integer(options, 'folds') ?? 5,
    maxBins: integer(options, 'max-bins'),
    pruning,
  };
  const result = trainModel(table, label, trainOptions);
  const { tree, ...rest } = result;
  const model: ModelFile = {
    format: MODEL_FORMAT,
    version: 1,
    target,
    positiveValue: positiveOption ?? '1/yes/true',
    features: table.columns.map((c) => ({ name: c.name, kind: c.kind })),
    root: tree,
    ...rest,
  };
  writeFileSync(modelPath, `${JSON.stringify(model, null, 2)}\n`);
  return `Wrote ${modelPath}: ${result.segments.length} leaves from ${rows.length} rows\n`;
}

function predictCommand(options: Map<string, string>): string {
  const modelPath = required(options, 'model');
  const model = JSON.parse(readFileSync(modelPath, 'utf8')) as ModelFile;
  if (model.format !== MODEL_FORMAT) throw new UsageError(`${modelPath} is not a tree model file`);
  const root = treeNodeSchema.parse(model.root);
  const { header, rows } = readCsv(required(options, 'data'));
  const table: Table = {
    rowCount: rows.length,
    columns: model.features.map((f) => {
      const input = column(header, rows, f.name, f.kind);
      return input.kind === 'numeric'
        ? numericColumn(f.name, input.values)
        : categoricalColumn(f.name, input.values);
    }),
  };
  const probabilities = predict(root, table);
  const csv = `probability\n${Array.from(probabilities, (p) => (Number.isNaN(p) ? '' : String(p))).join('\n')}\n`;
  const out = options.get('out');
  if (!out) return csv;
  writeFileSync(out, csv);
  return '';
}

export function runCli(argv: string[]): { code: number; stdout: string; stderr: string } {
  const [command, ...rest] = argv;
  try {
    if (command === 'fit') return { code: 0, stdout: '', stderr: fitCommand(parseArgs(rest)) };
    if (command === 'predict') return { code: 0, stdout: predictCommand(parseArgs(rest)), stderr: '' };
    throw new UsageError(
      'Usage: tree fit --data FILE.csv --target COLUMN --model OUT.json | tree predict --model M.json --data FILE.csv',
    );
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    return { code: error instanceof UsageError ? 2 : 1, stdout: '', stderr: `tree: ${message}\n` };
  }
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const { code, stdout, stderr } = runCli(process.argv.slice(2));
  process.stdout.write(stdout);
  process.stderr.write(stderr);
  process.exitCode = code;
}
