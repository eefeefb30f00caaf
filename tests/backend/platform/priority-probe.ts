// Worker-thread entry for worker-priority.test.ts: reports the thread's own nice value.
import os from 'node:os';
import { parentPort } from 'node:worker_threads';

parentPort?.postMessage(os.getPriority(0));
