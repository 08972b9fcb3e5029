import { useState } from 'react';
import type { ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { useDeleteExhibition } from '@/features/exhibitions/api/save-exhibition';

/** Deletes the exhibition after a confirmation; one with display periods or a loan is refused by the server, with its reason shown. */
export function DeleteExhibition({ exhibition, onDeleted }: { exhibition: ExhibitionDetail; onDeleted: () => void }) {
  const [confirming, setConfirming] = useState(false);
  const remove = useDeleteExhibition(exhibition.id);
  return (
    <section aria-label="Delete the exhibition" className="mt-8 flex flex-col gap-2 border-t border-paper-300 pt-4">
      {remove.isError ? <ErrorNotice error={remove.error} title="The exhibition was not deleted." /> : null}
      {confirming ? (
        <div role="alertdialog" aria-label="Confirm deletion" className="flex flex-wrap items-center gap-2 text-sm">
          <p>Delete “{exhibition.title}” and its object list? This cannot be undone.</p>
          <Button variant="danger" size="sm" disabled={remove.isPending} onClick={() => remove.mutate(exhibition.version, { onSuccess: onDeleted })}>
            Delete
          </Button>
          <Button size="sm" onClick={() => setConfirming(false)}>
            Keep it
          </Button>
        </div>
      ) : (
        <div>
          <Button variant="quiet" onClick={() => setConfirming(true)}>
            Delete this exhibition…
          </Button>
        </div>
      )}
    </section>
  );
}
