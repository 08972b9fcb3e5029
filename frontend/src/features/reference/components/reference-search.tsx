import { useEffect, useState, type FormEvent } from 'react';
import { referenceListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { SearchField } from '@/components/ui/search-field';

export interface ReferenceSearchProps {
  /** What is searched, e.g. "makers". */
  what: string;
  label: string;
  q: string | undefined;
  onSearch: (q: string | undefined) => void;
}

/** The one search box of a reference list; the text goes to the API as `q`. */
export function ReferenceSearch({ what, label, q, onSearch }: ReferenceSearchProps) {
  const [text, setText] = useState(q ?? '');
  useEffect(() => setText(q ?? ''), [q]);

  function submit(event: FormEvent) {
    event.preventDefault();
    onSearch(text.trim() || undefined);
  }

  return (
    <form role="search" aria-label={`Search ${what}`} onSubmit={submit} className="mb-4 flex flex-wrap items-end gap-3">
      <SearchField label={label} value={text} onText={setText} querySchema={referenceListQuerySchema} fieldClassName="w-72" />
      <Button type="submit" variant="primary">
        Search
      </Button>
      {q ? (
        <Button variant="quiet" onClick={() => onSearch(undefined)}>
          Clear search
        </Button>
      ) : null}
    </form>
  );
}
