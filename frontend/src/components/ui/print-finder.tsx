import { useState, type FormEvent } from 'react';
import { printListQuerySchema, type PrintListItem } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { SearchField } from '@/components/ui/search-field';
import { useFindPrints } from '@/lib/prints-api';

interface PrintFinderProps {
  /** Prints already on the record: shown, with `takenLabel`, and not offered again. */
  taken: ReadonlySet<string>;
  takenLabel: string;
  /** Prints chosen in this pass, not yet saved. */
  chosen: ReadonlySet<string>;
  onChoose: (print: PrintListItem) => void;
}

/** Finds prints in the catalogue by accession number or words and offers each to be chosen (a loan's or an exhibition's list). */
export function PrintFinder({ taken, takenLabel, chosen, onChoose }: PrintFinderProps) {
  const [text, setText] = useState('');
  const [q, setQ] = useState('');
  const found = useFindPrints({ q, pageSize: 10 });

  function search(event: FormEvent) {
    event.preventDefault();
    setQ(text.trim());
  }

  const results = q && found.data ? found.data.data : null;
  return (
    <>
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
                <Button size="sm" disabled={taken.has(p.id) || chosen.has(p.id)} onClick={() => onChoose(p)} aria-label={`Choose ${p.accessionNumber}`}>
                  {taken.has(p.id) ? takenLabel : chosen.has(p.id) ? 'Chosen' : 'Choose'}
                </Button>
                <span className="mono">{p.accessionNumber}</span> {p.title}
              </li>
            ))}
          </ul>
        )
      ) : null}
    </>
  );
}
