import { useState } from 'react';
import type { ImportJob, ImportRow, ImportRowsQuery } from '@toneledger/common/schemas/catalogue';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { Pagination } from '@/components/ui/pagination';
import { formatCount } from '@/lib/format';
import { useImportRows } from '@/features/catalogue/api/get-import-rows';

const ACTION_LABELS: Record<ImportRow['action'], string> = { create: 'New print', update: 'Update', unchanged: 'No change' };

const blank = (value: string) => (value === '' ? <span className="text-ink-600">empty</span> : value);

function Changes({ row }: { row: ImportRow }) {
  if (row.action === 'create') return <span className="text-ink-700">Created from the row</span>;
  if (row.action === 'unchanged') return <span className="text-ink-700">Every field already matches</span>;
  return (
    <ul className="flex flex-col gap-0.5">
      {row.changes.map((c) => (
        <li key={c.field}>
          <span className="font-medium">{c.label}:</span> {blank(c.before)} <span aria-label="becomes">→</span> {blank(c.after)}
        </li>
      ))}
    </ul>
  );
}

/** What every row of a checked file would do, a page at a time: create a print, update one (each change, before → after), or nothing. */
export function ImportRows({ job }: { job: ImportJob }) {
  const [query, setQuery] = useState<ImportRowsQuery>({ page: 1, pageSize: 50 });
  const rows = useImportRows(job.id, query);
  const filters: { value: ImportRowsQuery['action']; label: string; count: number }[] = [
    { value: undefined, label: 'All rows', count: job.toCreate + job.toUpdate + job.unchanged },
    { value: 'create', label: 'New prints', count: job.toCreate },
    { value: 'update', label: 'Updates', count: job.toUpdate },
    { value: 'unchanged', label: 'No change', count: job.unchanged },
  ];
  return (
    <section aria-label="What each row does" className="flex flex-col gap-2">
      <div role="group" aria-label="Show" className="flex flex-wrap gap-1.5 text-sm">
        {filters.map((f) => (
          <button
            key={f.label}
            type="button"
            aria-pressed={query.action === f.value}
            onClick={() => setQuery({ page: 1, pageSize: query.pageSize, action: f.value })}
            className={`rounded border px-2.5 py-1 ${query.action === f.value ? 'border-iron-700 bg-iron-50 font-semibold' : 'border-paper-400 bg-white'}`}
          >
            {f.label} <span className="num">({formatCount(f.count)})</span>
          </button>
        ))}
      </div>
      {rows.isError ? <ErrorNotice error={rows.error} title="The rows could not be loaded." /> : null}
      {rows.isPending ? <Loading label="Loading the rows…" /> : null}
      {rows.data ? (
        <>
          <div className="overflow-x-auto rounded border border-paper-300 bg-white">
            <table className="w-full border-collapse text-left text-sm">
              <caption className="sr-only">What each row of {job.fileName} does</caption>
              <thead className="bg-paper-100 text-xs text-ink-700 uppercase">
                <tr>
                  <th scope="col" className="px-3 py-2">Row</th>
                  <th scope="col" className="px-3 py-2">Accession number</th>
                  <th scope="col" className="px-3 py-2">Does</th>
                  <th scope="col" className="px-3 py-2">Changes</th>
                </tr>
              </thead>
              <tbody>
                {rows.data.data.map((row) => (
                  <tr key={row.row} className="border-t border-paper-200 align-top">
                    <td className="num px-3 py-1.5">{row.row}</td>
                    <td className="mono px-3 py-1.5 whitespace-nowrap">{row.accessionNumber}</td>
                    <td className="px-3 py-1.5 whitespace-nowrap">{ACTION_LABELS[row.action]}</td>
                    <td className="px-3 py-1.5">
                      <Changes row={row} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pagination
            page={query.page}
            pageSize={query.pageSize}
            total={rows.data.pagination.total}
            onPageChange={(page) => setQuery({ ...query, page })}
            onPageSizeChange={(pageSize) => setQuery({ ...query, page: 1, pageSize })}
          />
        </>
      ) : null}
    </section>
  );
}
