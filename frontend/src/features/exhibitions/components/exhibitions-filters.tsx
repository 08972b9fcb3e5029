import { useEffect, useState, type FormEvent } from 'react';
import { exhibitionListQuerySchema } from '@toneledger/common/schemas/exhibitions';
import { Button } from '@/components/ui/button';
import { SearchField } from '@/components/ui/search-field';
import type { ExhibitionListQuery } from '@/lib/exhibitions-api';

const WHEN = [
  { value: undefined, label: 'All' },
  { value: 'current', label: 'Current' },
  { value: 'coming', label: 'Coming' },
  { value: 'past', label: 'Past' },
] as const;

/** Words and current / coming / past, each a key of the URL's query. */
export function ExhibitionsFilters({ query, onChange }: { query: ExhibitionListQuery; onChange: (patch: Partial<ExhibitionListQuery>) => void }) {
  const [text, setText] = useState(query.q ?? '');
  useEffect(() => setText(query.q ?? ''), [query.q]);

  function submit(event: FormEvent) {
    event.preventDefault();
    onChange({ q: text.trim() || undefined });
  }

  return (
    <div className="mb-4 flex flex-wrap items-end gap-4 print:hidden">
      <div role="group" aria-label="When" className="flex overflow-hidden rounded border border-paper-400">
        {WHEN.map((w) => (
          <button
            key={w.label}
            type="button"
            aria-pressed={query.when === w.value}
            onClick={() => onChange({ when: w.value })}
            className={`h-9 px-3 text-sm ${query.when === w.value ? 'bg-iron-800 text-paper-50' : 'bg-white text-ink-900 hover:bg-paper-100'}`}
          >
            {w.label}
          </button>
        ))}
      </div>
      <form role="search" aria-label="Filter exhibitions" onSubmit={submit} className="flex flex-wrap items-end gap-3">
        <SearchField label="Title, organiser or venue" value={text} onText={setText} querySchema={exhibitionListQuerySchema} fieldClassName="w-64" />
        <Button type="submit" variant="primary">
          Search
        </Button>
      </form>
    </div>
  );
}
