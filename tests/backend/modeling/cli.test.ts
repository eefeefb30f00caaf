import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../../backend/src/modeling/cli.js';
import { playTennis } from './datasets.js';

const dir = mkdtempSync(join(tmpdir(), 'tree-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function write(name: string, text: string) {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

// PlayTennis (Quinlan 1986, Table 1) with an invented numeric column and a missing cell
const tennisCsv = write(
  'tennis.csv',
  [
    'Outlook,Temperature,Humidity,Wind,Hours,Play',
    ...playTennis.map(
      (r, i) => `${r.outlook},${r.temperature},${r.humidity},${r.wind},${i === 3 ? '' : i % 5},${r.play}`,
    ),
  ].join('\n'),
);

describe('the tree command line', () => {
  it('fits a model from a CSV and writes the tree under root', () => {
    const model = join(dir, 'model.json');
    const run = runCli([
      'fit',
      '--data',
      tennisCsv,
      '--target',
      'Play',
      '--criterion',
      'entropy',
      '--model',
      model,
    ]);
    expect(run.stderr).toMatch(/Wrote/);
    expect(run.code).toBe(0);
    const saved = JSON.parse(readFileSync(model, 'utf8'));
    expect(saved.root.split.feature).toBe('Outlook');
    expect(saved.features).toContainEqual({ name: 'Hours', kind: 'numeric' });
  });

  it('predicts one probability per input row, in order', () => {
    const model = join(dir, 'model2.json');
    runCli(['fit', '--data', tennisCsv, '--target', 'Play', '--positive', 'Yes', '--model', model]);
    const out = join(dir, 'p.csv');
    expect(runCli(['predict', '--model', model, '--data', tennisCsv, '--out', out]).code).toBe(0);
    const lines = readFileSync(out, 'utf8').trim().split('\n');
    expect(lines[0]).toBe('probability');
    // a fully grown tree gives back the training labels
    expect(lines.slice(1).map(Number)).toEqual(playTennis.map((r) => (r.play === 'Yes' ? 1 : 0)));
  });

  it('explains a missing target, a one-class target and an unknown excluded column', () => {
    const model = join(dir, 'unused.json');
    const missing = runCli(['fit', '--data', tennisCsv, '--target', 'Leaves', '--model', model]);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/target column "Leaves" is not in the data/);
    const oneClass = runCli([
      'fit',
      '--data',
      tennisCsv,
      '--target',
      'Play',
      '--positive',
      'Maybe',
      '--model',
      model,
    ]);
    expect(oneClass.stderr).toMatch(/only one class/);
    const exclude = runCli([
      'fit',
      '--data',
      tennisCsv,
      '--target',
      'Play',
      '--exclude',
      'Wind,Rain',
      '--model',
      model,
    ]);
    expect(exclude.stderr).toMatch(/unknown columns: Rain/);
  });

  it('runs as npm run tree', async () => {
    const model = join(dir, 'model3.json');
    const { stderr } = await promisify(execFile)(
      'npm',
      ['run', '--silent', 'tree', '--', 'fit', '--data', tennisCsv, '--target', 'Play', '--model', model],
      { cwd: new URL('../../../', import.meta.url) },
    );
    expect(stderr).toMatch(/Wrote/);
    expect(JSON.parse(readFileSync(model, 'utf8')).root.n).toBe(14);
  });
});
