import { useState } from 'react';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { ErrorNotice } from '../../../components/error-notice';
import { useDeleteDataset } from '../api/delete-dataset';

export type DeleteDatasetButtonProps = {
  id: string;
  name: string;
  onDeleted: () => void;
};

export function DeleteDatasetButton({ id, name, onDeleted }: DeleteDatasetButtonProps) {
  const [open, setOpen] = useState(false);
  const remove = useDeleteDataset();
  return (
    <>
      <Button variant="danger" onClick={() => setOpen(true)}>
        Delete dataset
      </Button>
      <ConfirmDialog
        open={open}
        title={`Delete “${name}”?`}
        confirmLabel="Delete for good"
        tone="danger"
        busy={remove.isPending}
        onCancel={() => setOpen(false)}
        onConfirm={() =>
          remove.mutate(id, {
            onSuccess: () => {
              setOpen(false);
              onDeleted();
            },
          })
        }
      >
        <p>
          The dataset, its stored rows, its mapping and everything derived from it are deleted. This cannot be
          undone; the audit trail keeps a line saying that it happened.
        </p>
        {remove.isError && <ErrorNotice error={remove.error} title="The dataset was not deleted" />}
      </ConfirmDialog>
    </>
  );
}
