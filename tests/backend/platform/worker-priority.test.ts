import os from 'node:os';
import { describe, expect, it } from 'vitest';
import { startWorker } from '../../../backend/src/lib/start-worker';

describe.runIf(process.platform === 'linux')('background worker threads', () => {
  it('run below normal priority while the thread that answers requests keeps its own', async () => {
    const before = os.getPriority(0);
    const worker = startWorker(import.meta.url, 'priority-probe');
    const nice = await new Promise<number>((resolve, reject) => {
      worker.once('message', resolve);
      worker.once('error', reject);
    });
    await worker.terminate();
    expect(nice).toBe(Math.max(before, 10));
    expect(os.getPriority(0)).toBe(before);
  });
});
