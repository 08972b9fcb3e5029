import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { CohortQuery } from '@toneledger/common/schemas/research';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { Pagination } from '@/components/ui/pagination';
import { SidePanel } from '@/components/ui/side-panel';
import type { PrintsAsk } from '@/features/research/api/keys';
import { useCohortPrints } from '@/features/research/api/research';
import { fixed } from '@/features/research/utils/words';

/** The prints behind one figure, each a link to its catalogue record. */
export function PrintsPanel({ query, ask, title, onClose }: { query: CohortQuery; ask: PrintsAsk; title: string; onClose: () => void }) {
  const [page, setPage] = useState(1);
  const prints = useCohortPrints(query, ask, page);
  return (
    <SidePanel title="Prints behind the figure" description={title} onClose={onClose}>
      {prints.isPending ? <Loading label="Loading the prints…" /> : null}
      {prints.error ? <ErrorNotice error={prints.error} title="The prints could not be listed." /> : null}
      {prints.data ? (
        <>
          <p className="mb-2 text-sm text-ink-700">{prints.data.pagination.total} prints.</p>
          <ul className="flex flex-col gap-1 text-sm">
            {prints.data.data.map((p) => (
              <li key={p.printId} className="border-t border-paper-200 pt-1">
                <Link to={`/catalogue/prints/${p.printId}`}>{p.accessionNumber}</Link> {p.title ? <span>{p.title}</span> : null}
                <span className="num block text-xs text-ink-600">
                  {p.group} · ΔE00/yr {fixed(p.deltaEPerYear, 3)} · {p.time === null ? 'no survival time' : `${fixed(p.time, 1)} years, ${p.event ? 'event' : 'censored'}`}
                </span>
              </li>
            ))}
          </ul>
          {prints.data.pagination.total > prints.data.pagination.pageSize ? (
            <Pagination page={page} pageSize={prints.data.pagination.pageSize} total={prints.data.pagination.total} onPageChange={setPage} />
          ) : null}
        </>
      ) : null}
    </SidePanel>
  );
}
