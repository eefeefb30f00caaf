import { randomUUID } from 'node:crypto';
import { QUILLFERN_WINDOW } from '../../../backend/src/demo/quillfern';
import { type PublishableRun, setBriefSources } from '../../../backend/src/modules/teams/brief-sources';
import { demoBriefInputs } from './demo-inputs';

/**
 * Model runs of the invented demo data, trained by the engine, as publishing reads them. Until
 * the model runs and dataset storage are in this build, tests put them where publishing looks.
 */
export function useDemoRuns(options: { rows?: number } = {}) {
  const inputs = demoBriefInputs({ rows: options.rows ?? 600 });
  const datasetId = randomUUID();
  const runs = new Map<string, PublishableRun>();
  const states: { runId: string; state: string }[] = [];
  setBriefSources({
    loadRun: async (id) => runs.get(id) ?? null,
    loadColumns: async (id) => {
      if (id !== datasetId) throw new Error('No such dataset');
      return { ...inputs.columns, window: { ...QUILLFERN_WINDOW } };
    },
    setPublicationState: async (runId, state) => {
      states.push({ runId, state });
      const run = runs.get(runId);
      if (run) run.publicationState = state;
    },
  });
  return {
    inputs,
    datasetId,
    states,
    /** a run of the demo dataset whose publication the analyst has requested */
    requestedRun(state = 'requested'): string {
      const id = randomUUID();
      runs.set(id, { ...inputs.model, id, datasetId, publicationState: state, policyVersion: 1 });
      return id;
    },
  };
}
