import { useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { SearchField } from '@/components/ui/search-field';
import { findPrintsQueryOptions, useFindPrints } from '@/lib/prints-api';

const PAGE_SIZE = 10;

/**
 * Opens a print's measurements by accession number. An exact match opens at once; otherwise the
 * prints the catalogue search finds are listed to choose from.
 */
export function PrintFinder() {
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const [text, setText] = useState('');
  const [q, setQ] = useState('');
  const [searching, setSearching] = useState(false);
  const found = useFindPrints({ q, pageSize: PAGE_SIZE });

  async function submit(event: FormEvent) {
    event.preventDefault();
    const wanted = text.trim();
    if (!wanted) return;
    setSearching(true);
    try {
      const page = await queryClient.fetchQuery(findPrintsQueryOptions({ q: wanted, pageSize: PAGE_SIZE }));
      const exact = page.data.find((p) => p.accessionNumber.toLowerCase() === wanted.toLowerCase());
      if (exact) {
        navigate(`/measurements/prints/${exact.id}`);
        return;
      }
    } catch {
      // The list below shows the error.
    } finally {
      setSearching(false);
    }
    setQ(wanted);
  }

  const results = q && found.data ? found.data.data : null;
  return (
    <form role="search" aria-label="Open a print" onSubmit={submit} className="mb-6 flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-2">
        <SearchField label="Accession number" value={text} onText={setText} querySchema={printListQuerySchema} placeholder="For example 1979.3.12" fieldClassName="w-full max-w-sm" />
        <Button type="submit" variant="primary" disabled={searching}>
          Open print
        </Button>
      </div>
      {found.isError ? <ErrorNotice error={found.error} title="The search failed." /> : null}
      {results ? (
        results.length === 0 ? (
          <p role="status" className="text-sm text-ink-700">
            No print matches “{q}”.
          </p>
        ) : (
          <div>
            <p role="status" className="text-sm text-ink-700">
              No print has exactly that accession number. These match:
            </p>
            <ul aria-label="Prints found" className="mt-1 flex flex-col gap-1 text-sm">
              {results.map((p) => (
                <li key={p.id}>
                  <Link to={`/measurements/prints/${p.id}`}>
                    <span className="mono">{p.accessionNumber}</span> {p.title}
                  </Link>
                </li>
              ))}
            </ul>
          </div>
        )
      ) : null}
    </form>
  );
}
