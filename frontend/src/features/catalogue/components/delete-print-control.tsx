import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import type { Print } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { useDeletePrint, usePrintDeletion } from '@/features/catalogue/api/delete-print';

/** Deleting a print asks first, naming the accession number. */
export function DeletePrintControl({ print }: { print: Print }) {
  const [asking, setAsking] = useState(false);
  const remove = useDeletePrint();
  const navigate = useNavigate();
  const deletion = usePrintDeletion(print.id, print.version);

  // The command is offered only when the print may be deleted; otherwise the reason is said instead.
  if (deletion.data && !deletion.data.ok) {
    return (
      <p className="max-w-md text-xs text-ink-700" data-testid="delete-refused">
        Cannot be deleted: {deletion.data.reason}
      </p>
    );
  }
  if (!asking) {
    if (!deletion.data) return null;
    return (
      <Button variant="quiet" onClick={() => setAsking(true)}>
        Delete…
      </Button>
    );
  }
  return (
    <div role="group" aria-label={`Confirm deletion of ${print.accessionNumber}`} className="flex flex-col gap-2 rounded border border-danger-200 bg-danger-50 p-3 text-sm">
      <p className="text-ink-900">
        Delete <span className="mono font-medium">{print.accessionNumber}</span> and its process history? The audit trail keeps a record of
        the deletion; the print cannot be restored from this screen.
      </p>
      {remove.isError ? <ErrorNotice error={remove.error} title="The print was not deleted." /> : null}
      <div className="flex gap-2">
        <Button
          variant="danger"
          size="sm"
          disabled={remove.isPending}
          onClick={() =>
            remove.mutate({ id: print.id, version: print.version }, { onSuccess: () => navigate('/catalogue', { replace: true }) })
          }
        >
          {remove.isPending ? 'Deleting…' : 'Delete print'}
        </Button>
        <Button size="sm" onClick={() => setAsking(false)} disabled={remove.isPending}>
          Cancel
        </Button>
      </div>
    </div>
  );
}
