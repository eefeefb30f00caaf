import { startWorker } from '../lib/start-worker';
import type { BriefColumns, BriefModel, BriefSettings, ComputedTeam } from './team-briefs.js';

/** Computes the briefs in a worker thread, so the process keeps answering requests meanwhile. */
export function computeTeamBriefsInWorker(
  columns: BriefColumns,
  model: BriefModel,
  settings: Omit<BriefSettings, 'teamId'>,
): Promise<ComputedTeam[]> {
  return new Promise((resolve, reject) => {
    const worker = startWorker(import.meta.url, 'team-briefs-worker', {
      workerData: { columns, model, settings },
    });
    let settled = false;
    const finish = (action: () => void) => {
      if (settled) return;
      settled = true;
      action();
      void worker.terminate();
    };
    worker.on('message', (message: { type: string; result?: ComputedTeam[]; message?: string }) => {
      if (message.type === 'result') finish(() => resolve(message.result!));
      else finish(() => reject(new Error(message.message)));
    });
    worker.on('error', (error) => finish(() => reject(error)));
    worker.on('exit', (code) =>
      finish(() => reject(new Error(`The brief computation stopped (exit code ${code})`))),
    );
  });
}
