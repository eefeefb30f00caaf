import { describe, expect, it } from 'vitest';
import { batched } from '../../../backend/src/lib/batch';

/** A lookup whose batches stay open until the test releases them. */
function heldLookup() {
  const batches: number[][] = [];
  const releases: Array<() => void> = [];
  const lookup = batched(
    (inputs: number[]) =>
      new Promise<string[]>((resolve, reject) => {
        batches.push(inputs);
        releases.push(() =>
          inputs.includes(-1) ? reject(new Error('bad batch')) : resolve(inputs.map((n) => `#${n}`)),
        );
      }),
    { maxBatch: 4 },
  );
  return { lookup, batches, release: () => releases.shift()?.() };
}

const tick = () => new Promise((resolve) => setImmediate(resolve));

describe('batched lookups', () => {
  it('sends a lone call at once, as a batch of one', async () => {
    const { lookup, batches, release } = heldLookup();
    const answer = lookup(7);
    expect(batches).toEqual([[7]]);
    release();
    expect(await answer).toBe('#7');
  });

  it('gathers the calls that arrive while a batch runs, in order, at most maxBatch at a time', async () => {
    const { lookup, batches, release } = heldLookup();
    const answers = [1, 2, 3, 4, 5, 6, 7].map((n) => lookup(n));
    expect(batches).toEqual([[1]]);
    release();
    await tick();
    expect(batches).toEqual([[1], [2, 3, 4, 5]]);
    release();
    await tick();
    expect(batches).toEqual([[1], [2, 3, 4, 5], [6, 7]]);
    release();
    expect(await Promise.all(answers)).toEqual(['#1', '#2', '#3', '#4', '#5', '#6', '#7']);
  });

  it('fails every call of a failed batch, and only those', async () => {
    const { lookup, batches, release } = heldLookup();
    const first = lookup(1);
    const bad = [lookup(-1), lookup(2)];
    release();
    await tick();
    expect(batches[1]).toEqual([-1, 2]);
    const later = lookup(3);
    release();
    await expect(bad[0]).rejects.toThrow('bad batch');
    await expect(bad[1]).rejects.toThrow('bad batch');
    await tick();
    release();
    expect(await first).toBe('#1');
    expect(await later).toBe('#3');
  });

  it('fails the batch when the lookup answers with the wrong number of results', async () => {
    const lookup = batched(async (inputs: number[]) => inputs.slice(1));
    await expect(lookup(1)).rejects.toThrow(/a batch of 1 returned 0 results/);
  });
});
