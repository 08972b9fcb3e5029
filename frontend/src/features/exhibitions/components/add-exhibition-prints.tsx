import { useState, type FormEvent } from 'react';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import type { ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { SearchField } from '@/components/ui/search-field';
import { useFindPrints } from '@/lib/prints-api';
import { useAddExhibitionPrints } from '@/features/exhibitions/api/save-exhibition';

/** Finds prints in the catalogue and puts them on the object list (each then waits for a conservator). */
export function AddExhibitionPrints({ exhibition, onDone }: { exhibition: ExhibitionDetail; onDone: () => void }) {
  const [text, setText] = useState('');
  const [q, setQ] = useState('');
  const [chosen, setChosen] = useState<{ id: string; accessionNumber: string }[]>([]);
  const found = useFindPrints({ q, pageSize: 10 });
  const add = useAddExhibitionPrints(exhibition.id);
  const listed = new Set(exhibition.objects.map((o) => o.printId));
  const picked = new Set(chosen.map((c) => c.id));

  function search(event: FormEvent) {
    event.preventDefault();
    setQ(text.trim());
  }

  const results = q && found.data ? found.data.data : null;
  return (
    <section aria-label="Add prints to the object list" className="flex flex-col gap-3 rounded border border-paper-300 bg-paper-50 p-3 print:hidden">
      <form role="search" aria-label="Find prints" onSubmit={search} className="flex flex-wrap items-end gap-2">
        <SearchField label="Accession number or title" value={text} onText={setText} querySchema={printListQuerySchema} fieldClassName="w-72" />
        <Button type="submit">Find</Button>
      </form>
      {found.isError ? <ErrorNotice error={found.error} title="The search failed." /> : null}
      {results ? (
        results.length === 0 ? (
          <p role="status" className="text-sm text-ink-700">
            No print matches “{q}”.
          </p>
        ) : (
          <ul aria-label="Prints found" className="flex flex-col gap-1 text-sm">
            {results.map((p) => (
              <li key={p.id} className="flex items-center gap-2">
                <Button
                  size="sm"
                  disabled={listed.has(p.id) || picked.has(p.id)}
                  onClick={() => setChosen([...chosen, { id: p.id, accessionNumber: p.accessionNumber }])}
                  aria-label={`Choose ${p.accessionNumber}`}
                >
                  {listed.has(p.id) ? 'On the list' : picked.has(p.id) ? 'Chosen' : 'Choose'}
                </Button>
                <span className="mono">{p.accessionNumber}</span> {p.title}
              </li>
            ))}
          </ul>
        )
      ) : null}
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
