import { parentPort, workerData } from 'node:worker_threads';
import { type BriefColumns, type BriefModel, type BriefSettings, computeTeamBriefs } from './team-briefs.js';

/** Worker-thread entry of computeTeamBriefsInWorker. */
const { columns, model, settings } = workerData as {
  columns: BriefColumns;
  model: BriefModel;
  settings: BriefSettings;
};
try {
  parentPort!.postMessage({ type: 'result', result: computeTeamBriefs(columns, model, settings) });
} catch (error) {
  parentPort!.postMessage({ type: 'error', message: error instanceof Error ? error.message : String(error) });
}
