import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { exhibitionsApi } from '@toneledger/common/api/exhibitions';
import { can } from '@toneledger/common/domain/roles';
import { APPROVAL, APPROVAL_LABELS, type ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { Button, buttonClasses } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PrintArea } from '@/components/ui/print-area';
import { TableHead } from '@/components/ui/table-head';
import { urlOf } from '@/lib/api-client';
import { useMe } from '@/lib/auth';
import { useExhibition } from '@/lib/exhibitions-api';
import { formatDay } from '@/lib/format';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useRemoveExhibitionPrint } from '@/features/exhibitions/api/save-exhibition';
import { AddExhibitionPrints } from '@/features/exhibitions/components/add-exhibition-prints';
import { ExhibitionObjectEntry } from '@/features/exhibitions/components/exhibition-object';

/** The browser's print dialog; a seam so tests can see it was asked for. */
export const printer = {
  print(): void {
    window.print();
  },
};

function Venues({ exhibition }: { exhibition: ExhibitionDetail }) {
  return (
    <table className="w-full border-collapse rounded border border-paper-300 bg-white text-left text-sm">
      <caption className="sr-only">Venues of {exhibition.title}</caption>
      <TableHead columns={['Venue', 'Place', 'Opens', 'Closes']} />
      <tbody>
        {exhibition.venues.map((v) => (
          <tr key={v.id} className="border-t border-paper-200">
            <td className="px-2 py-1.5 font-medium">{v.name}</td>
            <td className="px-2 py-1.5">{v.place ?? '—'}</td>
            <td className="px-2 py-1.5 whitespace-nowrap">{formatDay(v.opensOn)}</td>
            <td className="px-2 py-1.5 whitespace-nowrap">{formatDay(v.closesOn)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function ExhibitionView({ exhibition }: { exhibition: ExhibitionDetail }) {
  const me = useMe();
  const [adding, setAdding] = useState(false);
  const remove = useRemoveExhibitionPrint(exhibition.id);
  const mayWrite = can(me.role, 'loans.write');
  const counts = APPROVAL.map((a) => ({ a, n: exhibition.objects.filter((o) => o.approval === a).length })).filter((c) => c.n > 0);
  return (
    <article className="flex flex-col gap-5">
      <nav aria-label="Breadcrumb" className="text-sm print:hidden">
        <Link to="/exhibitions">Exhibitions</Link> <span aria-hidden="true">›</span> {exhibition.title}
      </nav>
      <PrintArea className="flex flex-col gap-5">
        <div className="flex flex-wrap items-end justify-between gap-3 border-b border-paper-300 pb-4">
          <div className="min-w-0">
            <h1 className="text-2xl sm:text-[1.75rem]">{exhibition.title}</h1>
            <p className="mt-1 text-sm text-ink-700">
              {exhibition.organiser ? `${exhibition.organiser} · ` : ''}
              {formatDay(exhibition.opensOn)} – {formatDay(exhibition.closesOn)} · {exhibition.objectCount} {exhibition.objectCount === 1 ? 'print' : 'prints'}
            </p>
          </div>
          <div className="flex flex-wrap gap-2 print:hidden">
            {mayWrite ? (
              <Link to={`/exhibitions/${exhibition.id}/edit`} className={buttonClasses()}>
                Edit
              </Link>
            ) : null}
            <a href={urlOf(exhibitionsApi.checklistCsv, { params: { id: exhibition.id } })} className={buttonClasses()} download>
              Object list (CSV)
            </a>
            <Button onClick={() => printer.print()}>Print</Button>
          </div>
        </div>
        {exhibition.summary ? <p className="max-w-3xl text-sm whitespace-pre-line">{exhibition.summary}</p> : null}
        <section aria-labelledby="venues" className="flex flex-col gap-2">
          <h2 id="venues" className="text-lg">
            Venues
          </h2>
          <Venues exhibition={exhibition} />
        </section>
        <section aria-labelledby="objects" className="flex flex-col gap-2">
          <h2 id="objects" className="text-lg">
            Object list ({exhibition.objects.length})
          </h2>
          {counts.length > 0 ? <p className="text-sm text-ink-700">{counts.map((c) => `${c.n} ${APPROVAL_LABELS[c.a].toLowerCase()}`).join(' · ')}</p> : null}
          {remove.isError ? <ErrorNotice error={remove.error} title="The print was not taken off the list." /> : null}
          {exhibition.objects.length === 0 ? (
            <p className="text-sm text-ink-700">No prints on the list yet.</p>
          ) : (
            <ul className="flex flex-col gap-3">
              {exhibition.objects.map((o) => (
                <ExhibitionObjectEntry
                  key={o.printId}
                  exhibition={exhibition}
                  object={o}
                  role={me.role}
                  removing={remove.isPending}
                  onRemove={mayWrite ? () => remove.mutate({ printId: o.printId, version: exhibition.version }) : undefined}
                />
              ))}
            </ul>
          )}
          {mayWrite ? (
            adding ? (
              <AddExhibitionPrints exhibition={exhibition} onDone={() => setAdding(false)} />
            ) : (
              <div className="print:hidden">
                <Button onClick={() => setAdding(true)}>Add prints</Button>
              </div>
            )
          ) : null}
        </section>
      </PrintArea>
    </article>
  );
}

/** One exhibition: its venues, object list with approvals, display periods and light figures. */
export function ExhibitionPage() {
  const { id = '' } = useParams();
  const exhibition = useExhibition(id);
  useDocumentTitle(exhibition.data ? exhibition.data.title : 'Exhibition');
  if (exhibition.isPending) return <Loading label="Loading the exhibition…" />;
  if (exhibition.isError) return <ErrorNotice error={exhibition.error} title="The exhibition could not be loaded." />;
  return <ExhibitionView exhibition={exhibition.data} />;
}
