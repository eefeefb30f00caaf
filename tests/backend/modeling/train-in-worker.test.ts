import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { trainModel } from '../../../backend/src/modeling/train.js';
import { trainInWorker } from '../../../backend/src/modeling/train-in-worker.js';
import { allowed, staffTable } from './staff-table.js';

describe('training in a worker thread', () => {
  const { table, label } = staffTable(500);
  const options = { features: allowed, maxDepth: 4, minLeaf: 10, folds: 3, seed: 2 };

  it('reports progress and returns the same model as training in place', async () => {
    const progress: number[] = [];
    const result = await trainInWorker(table, label, options, (p) => progress.push(p.progress));
    expect(progress.at(-1)).toBe(1);
    expect(JSON.stringify(result)).toBe(JSON.stringify(trainModel(table, label, options)));
  });

  it("passes the engine's error back", async () => {
    await expect(
      trainInWorker(
        table,
        label.map(() => 1),
        options,
      ),
    ).rejects.toThrow(/only one class/);
  });

  it('stops when cancelled', async () => {
    const controller = new AbortController();
    const pending = trainInWorker(table, label, options, undefined, controller.signal);
    controller.abort();
    await expect(pending).rejects.toThrow(/cancelled/);
  });

  it('works in a server process started with tsx', async () => {
    const script = `
      import { trainInWorker } from './backend/src/modeling/train-in-worker.ts';
      import { buildTable } from './backend/src/modeling/table.ts';
      const table = buildTable([{ name: 'x', kind: 'numeric', values: Array.from({ length: 60 }, (_, i) => i) }]);
      const result = await trainInWorker(table, table.columns[0].values.map((v) => (v > 30 ? 1 : 0)), { minLeaf: 5, k: 5, pruning: 'none' });
      console.log(JSON.stringify(result.tree.split));
    `;
    const { stdout } = await promisify(execFile)(
      process.execPath,
      ['--import', 'tsx', '--input-type=module', '-e', script],
      {
        cwd: new URL('../../../', import.meta.url),
      },
    );
    expect(JSON.parse(stdout)).toMatchObject({ feature: 'x', threshold: 30.5 });
  });
});
