/**
 * Benchmark of the tree engine (not a test): `npm run bench [-- --sizes 10000,100000 --repeats 5
 * --no-sklearn --ml-cart-rows 2000]`. For each seeded synthetic staff table (about 30 mixed
 * columns with missing values, invented) it prints our fit time (Gini, depth 8, min leaf 5), the
 * first fit in a fresh process, 5-fold CV + pruning time, peak memory and holdout AUC, beside
 * scikit-learn's fit of the same one-hot encoded data (Debian's python3-sklearn, when installed)
 * and ml-cart's on a small table.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { closeSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { DecisionTreeClassifier as MlCart } from 'ml-cart';
import { fitTree } from '../backend/src/modeling/fit.js';
import { rocAuc } from '../backend/src/modeling/metrics.js';
import { seededRandom, stratifiedHoldout } from '../backend/src/modeling/split-rows.js';
import { selectRows, type Table } from '../backend/src/modeling/table.js';
import { trainModel } from '../backend/src/modeling/train.js';
import { predict } from '../backend/src/modeling/tree-json.js';
import { syntheticStaff } from './synthetic-staff.js';

// Debian's python3-sklearn lives beside the system Python, not a user-installed one
const PYTHON = process.env.BENCH_PYTHON ?? '/usr/bin/python3';
const FIT = { criterion: 'gini' as const, maxDepth: 8, minLeaf: 5, k: 1, pruning: 'none' as const };

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function seconds(action: () => void): number {
  const start = process.hrtime.bigint();
  action();
  return Number(process.hrtime.bigint() - start) / 1e9;
}

function dataset(rows: number) {
  const { table, label } = syntheticStaff(rows, 42);
  const { train, test } = stratifiedHoldout(label, 0.2, seededRandom(42));
  return {
    train: selectRows(table, train),
    test: selectRows(table, test),
    yTrain: Uint8Array.from(train, (r) => label[r]),
    yTest: Uint8Array.from(test, (r) => label[r]),
  };
}

/** One-hot encoded float32 columns written one after the other (column-major). */
function writeMatrix(table: Table, fill: number[], path: string): number {
  const fd = openSync(path, 'w');
  let count = 0;
  table.columns.forEach((c, j) => {
    if (c.kind === 'numeric') {
      // scikit-learn 1.2 has no missing values: a value below the minimum stands for them
      writeSync(
        fd,
        Float32Array.from(c.values, (v) => (Number.isNaN(v) ? fill[j] : v)),
      );
      count++;
    } else {
      for (let level = 0; level < c.levels.length; level++) {
        writeSync(
          fd,
          Float32Array.from(c.codes, (code) => (code === level ? 1 : 0)),
        );
        count++;
      }
    }
  });
  closeSync(fd);
  return count;
}

function sklearnFit(d: ReturnType<typeof dataset>, repeats: number) {
  const dir = mkdtempSync(join(tmpdir(), 'bench-'));
  try {
    const fill = d.train.columns.map((c) => {
      if (c.kind !== 'numeric') return 0;
      let min = Number.POSITIVE_INFINITY;
      for (const v of c.values) if (v < min) min = v;
      return min - 1;
    });
    const columns = writeMatrix(d.train, fill, join(dir, 'xtrain'));
    writeMatrix(d.test, fill, join(dir, 'xtest'));
    for (const [name, y] of [
      ['ytrain', d.yTrain],
      ['ytest', d.yTest],
    ] as const) {
      const fd = openSync(join(dir, name), 'w');
      writeSync(fd, y);
      closeSync(fd);
    }
    const spec = {
      columns,
      train: d.train.rowCount,
      test: d.test.rowCount,
      xTrain: join(dir, 'xtrain'),
      xTest: join(dir, 'xtest'),
      yTrain: join(dir, 'ytrain'),
      yTest: join(dir, 'ytest'),
      repeats,
      maxDepth: FIT.maxDepth,
      minLeaf: FIT.minLeaf,
    };
    const out = execFileSync(
      PYTHON,
      [join(import.meta.dirname ?? '.', 'sklearn-fit.py'), JSON.stringify(spec)],
      {
        env: { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1' },
        maxBuffer: 1 << 20,
      },
    );
    return JSON.parse(out.toString()) as { first: number; median: number; auc: number; version: string };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function hasSklearn(): boolean {
  return spawnSync(PYTHON, ['-c', 'import sklearn'], { stdio: 'ignore' }).status === 0;
}

/** First fit in a fresh process: run this file again with --cold. */
function coldFit(rows: number): number {
  const out = execFileSync(process.execPath, [
    ...process.execArgv,
    fileURLToPath(import.meta.url),
    '--cold',
    String(rows),
  ]);
  return Number(out.toString().trim());
}

function mlCartFit(rows: number) {
  const d = dataset(rows);
  const toMatrix = (t: Table) =>
    Array.from({ length: t.rowCount }, (_, r) =>
      t.columns.map((c) =>
        c.kind === 'numeric' ? (Number.isNaN(c.values[r]) ? -1e9 : c.values[r]) : c.codes[r],
      ),
    );
  const x = toMatrix(d.train);
  const model = new MlCart({ gainFunction: 'gini', maxDepth: FIT.maxDepth, minNumSamples: FIT.minLeaf });
  const mlCartSeconds = seconds(() => model.train(x, Array.from(d.yTrain)));
  const oursSeconds = seconds(() => fitTree(d.train, d.yTrain, FIT));
  return { rows, mlCartSeconds, oursSeconds };
}

function argument(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

function main() {
  const cold = argument('cold');
  if (cold) {
    const d = dataset(Number(cold));
    process.stdout.write(`${seconds(() => fitTree(d.train, d.yTrain, FIT))}\n`);
    return;
  }
  const sizes = (argument('sizes') ?? '10000,100000,500000').split(',').map(Number);
  const repeats = Number(argument('repeats') ?? 5);
  const withSklearn = !process.argv.includes('--no-sklearn') && hasSklearn();
  const mlCartRows = Number(argument('ml-cart-rows') ?? 2000);
  const table: Record<string, string | number>[] = [];
  for (const rows of sizes) {
    const d = dataset(rows);
    const first = coldFit(rows);
    const times: number[] = [];
    let tree = fitTree(d.train, d.yTrain, FIT).tree;
    for (let i = 0; i < repeats; i++)
      times.push(seconds(() => (tree = fitTree(d.train, d.yTrain, FIT).tree)));
    const auc = rocAuc(d.yTest, predict(tree, d.test));
    const cv = seconds(() => trainModel(d.train, d.yTrain, { ...FIT, pruning: 'cv', folds: 5 }));
    const peakMb = process.resourceUsage().maxRSS / 1024;
    const row: Record<string, string | number> = {
      rows,
      'fit, fresh process (s)': first.toFixed(3),
      'fit, warm median (s)': median(times).toFixed(3),
      '5-fold CV + pruning (s)': cv.toFixed(2),
      'peak RSS so far (MB)': Math.round(peakMb),
      'holdout AUC': auc.toFixed(3),
    };
    if (withSklearn) {
      const s = sklearnFit(d, repeats);
      row['scikit-learn fit (s)'] = s.median.toFixed(3);
      row['ours / scikit-learn'] = (median(times) / s.median).toFixed(2);
      row['scikit-learn AUC'] = s.auc.toFixed(3);
    }
    table.push(row);
    console.error(JSON.stringify(row));
  }
  console.table(table);
  if (!withSklearn) console.log('scikit-learn not run (missing, or --no-sklearn)');
  if (mlCartRows > 0) {
    const m = mlCartFit(mlCartRows);
    console.table([
      {
        rows: m.rows,
        'ml-cart fit (s)': m.mlCartSeconds.toFixed(2),
        'our fit (s)': m.oursSeconds.toFixed(3),
        'ml-cart / ours': (m.mlCartSeconds / m.oursSeconds).toFixed(0),
      },
    ]);
  }
}

main();
