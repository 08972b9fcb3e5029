import { useState } from 'react';
import type { ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { PrintFinder } from '@/components/ui/print-finder';
import { useAddExhibitionPrints } from '@/features/exhibitions/api/save-exhibition';

/** Finds prints in the catalogue and puts them on the object list (each then waits for a conservator). */
export function AddExhibitionPrints({ exhibition, onDone }: { exhibition: ExhibitionDetail; onDone: () => void }) {
  const [chosen, setChosen] = useState<{ id: string; accessionNumber: string }[]>([]);
  const add = useAddExhibitionPrints(exhibition.id);
  const listed = new Set(exhibition.objects.map((o) => o.printId));
  const picked = new Set(chosen.map((c) => c.id));
  return (
    <section aria-label="Add prints to the object list" className="flex flex-col gap-3 rounded border border-paper-300 bg-paper-50 p-3 print:hidden">
      <PrintFinder taken={listed} takenLabel="On the list" chosen={picked} onChoose={(p) => setChosen([...chosen, { id: p.id, accessionNumber: p.accessionNumber }])} />
      {chosen.length > 0 ? <p className="text-sm">Chosen: {chosen.map((c) => c.accessionNumber).join(', ')}</p> : null}
      {add.isError ? <ErrorNotice error={add.error} title="The prints were not added." /> : null}
      <div className="flex gap-2">
        <Button
          variant="primary"
          disabled={chosen.length === 0 || add.isPending}
          onClick={() => add.mutate({ printIds: chosen.map((c) => c.id), version: exhibition.version }, { onSuccess: onDone })}
        >
          Add to the object list
        </Button>
        <Button onClick={onDone}>Cancel</Button>
      </div>
    </section>
  );
}
