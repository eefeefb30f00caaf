import { useQueries } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { modelQueryOptions } from '../../features/models/api/get-model';
import { CompareTable } from '../../features/models/components/compare-table';

export function Component() {
  const [params] = useSearchParams();
  const ids = (params.get('ids') ?? '').split(',').filter(Boolean);
  const queries = useQueries({ queries: ids.map((id) => modelQueryOptions(id)) });
  const failed = queries.find((q) => q.isError);
  const runs = queries.flatMap((q) => (q.data ? [q.data] : []));
  return (
    <>
      <PageHeader title="Compare model runs" description="Settings, figures and top drivers side by side." />
      {failed?.error && <ErrorNotice error={failed.error} title="A run could not be loaded" />}
      {ids.length < 2 && (
        <p className="text-slate-600">Choose two or more runs in the list to compare them.</p>
      )}
      {runs.length === ids.length && ids.length >= 2 && <CompareTable runs={runs} />}
    </>
  );
}
