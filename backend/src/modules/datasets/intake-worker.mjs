// Worker bootstrap: the intake code is TypeScript, and a worker thread does not get the tsx
// loader of the process that started it (under node --import tsx nor under vitest), so it
// registers tsx for itself first.
import { register } from 'tsx/esm/api';

register();
await import('./intake-worker.ts');
