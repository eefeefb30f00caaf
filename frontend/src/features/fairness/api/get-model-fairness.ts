import { queryOptions, useQuery } from '@tanstack/react-query';
import { type ModelFairnessView, modelFairnessSchema } from '../../../../../shared/privacy';
import { api } from '../../../lib/api-client';

export const fairnessKeys = {
  all: ['fairness'] as const,
  run: (modelRunId: string) => [...fairnessKeys.all, modelRunId] as const,
};

export function getModelFairness(modelRunId: string): Promise<ModelFairnessView> {
  return api.get(`/api/models/${encodeURIComponent(modelRunId)}/fairness`, { schema: modelFairnessSchema });
}

export const modelFairnessQueryOptions = (modelRunId: string) =>
  queryOptions({ queryKey: fairnessKeys.run(modelRunId), queryFn: () => getModelFairness(modelRunId) });

export function useModelFairness(modelRunId: string) {
  return useQuery(modelFairnessQueryOptions(modelRunId));
}
