import type { DatasetMapping } from '../../../../../shared/datasets';

/** The one query-key factory of the datasets feature. */
export const datasetKeys = {
  all: ['datasets'] as const,
  list: () => [...datasetKeys.all, 'list'] as const,
  detail: (id: string) => [...datasetKeys.all, 'detail', id] as const,
  preview: (id: string, mapping: DatasetMapping | null) =>
    [...datasetKeys.all, 'preview', id, mapping] as const,
};
