import { useParams } from 'react-router-dom';
import { Button } from '../../components/button';
import { ErrorNotice } from '../../components/error-notice';
import { useModel } from '../../features/models/api/get-model';
import { ModelCard } from '../../features/models/components/model-card';

export function Component() {
  const { id = '' } = useParams();
  const run = useModel(id);
  return (
    <>
      <div className="mb-4 print:hidden">
        <Button variant="secondary" onClick={() => window.print()}>
          Print
        </Button>
      </div>
      {run.isError && <ErrorNotice error={run.error} title="The run could not be loaded" />}
      {run.data && <ModelCard run={run.data} />}
    </>
  );
}
