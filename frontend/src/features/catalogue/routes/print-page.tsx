import { useId, useState, type ComponentType, type ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { rightsLabel } from '@toneledger/common/domain/rights';
import { can } from '@toneledger/common/domain/roles';
import type { Print } from '@toneledger/common/schemas/catalogue';
import type { TimelineEntry } from '@toneledger/common/schemas/images';
import { Button, buttonClasses } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { isApiError } from '@/lib/api-client';
import { useMe } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrint, useTimeline } from '@/lib/prints-api';
import { useImages } from '@/lib/images-api';
import { printJsonHref } from '@/features/catalogue/api/exports';
import { ChemistryCaution } from '@/features/catalogue/components/chemistry-caution';
import { DeletePrintControl } from '@/features/catalogue/components/delete-print-control';
import { HistoryList } from '@/features/catalogue/components/history-list';
import { LocationPanel } from '@/features/catalogue/components/location-panel';
import { PrintIdentity } from '@/features/catalogue/components/print-identity';
import { ProcessTimeline } from '@/features/catalogue/components/process-timeline';
import { WarningsPanel } from '@/features/catalogue/components/warnings-panel';
import { BulkPanel } from '@/features/catalogue/components/bulk-panel';

function Panel({ title, children }: { title: string; children: ReactNode }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={id} className="mb-2 text-lg">
        {title}
      </h2>
      {children}
    </section>
  );
}

function TextBlock({ term, value }: { term: string; value: string | null | undefined }) {
  return (
    <div>
      <h3 className="font-sans text-xs font-semibold tracking-wider text-ink-700 uppercase">{term}</h3>
      <p className="mt-0.5 text-sm whitespace-pre-line text-ink-900">{value || <span className="text-ink-600">Not recorded</span>}</p>
    </div>
  );
}

const TIMELINE_KINDS: Record<TimelineEntry['kind'], string> = {
  catalogue: 'Catalogue', movement: 'Movement', condition: 'Condition', addendum: 'Addendum', image: 'Image', fixity: 'Fixity',
};

/** The print's whole life in one list, newest first. */
function TimelinePanel({ printId }: { printId: string }) {
  const timeline = useTimeline(printId);
  return (
    <Panel title="Timeline">
      {timeline.isPending ? <Loading label="Loading the timeline…" /> : null}
      {timeline.isError ? <ErrorNotice error={timeline.error} title="The timeline could not be loaded." /> : null}
      {timeline.data ? (
        timeline.data.length === 0 ? (
          <p className="text-sm text-ink-700">Nothing recorded yet.</p>
        ) : (
          <ol className="flex flex-col divide-y divide-paper-200">
            {timeline.data.map((entry, i) => (
              <li key={`${entry.at}-${i}`} className="py-2 text-sm">
                <p className="text-xs text-ink-700">
                  <time dateTime={entry.at}>{formatDateTime(entry.at)}</time> · {TIMELINE_KINDS[entry.kind]}
                  {entry.actorName ? ` · ${entry.actorName}` : ''}
                </p>
                <p className="font-medium">{entry.link ? <Link to={entry.link}>{entry.title}</Link> : entry.title}</p>
                {entry.detail ? <p className="whitespace-pre-line text-ink-800">{entry.detail}</p> : null}
              </li>
            ))}
          </ol>
        )
      ) : null}
    </Panel>
  );
}

function formatMoney(amount: number, currency: string | null | undefined): string {
  if (currency) {
    try {
      return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(amount);
    } catch {
      // An unknown code is shown as it is.
    }
  }
  return `${new Intl.NumberFormat('en-GB').format(amount)}${currency ? ` ${currency}` : ''}`;
}

/**
 * A panel another feature adds to the print page (the light dose). The app composes them in its
 * router, so the catalogue never imports another feature; each panel decides who may see it.
 */
export type PrintPagePanel = ComponentType<{ printId: string }>;

/** The print's latest recto image (captured last, then uploaded last), as the list's thumbnail shows it. */
function LatestRecto({ printId, accessionNumber }: { printId: string; accessionNumber: string }) {
  const me = useMe();
  const images = useImages(printId, {}, can(me.role, 'images.read'));
  const recto = [...(images.data ?? [])]
    .filter((i) => i.viewType === 'recto' && !i.withdrawn && (i.urls.screen || i.urls.thumb))
    .sort((a, b) => (b.capturedOn ?? '').localeCompare(a.capturedOn ?? '') || b.uploadedAt.localeCompare(a.uploadedAt))[0];
  if (!recto) return null;
  return (
    <figure className="rounded border border-paper-300 bg-white p-2" data-testid="latest-recto">
      <img src={recto.urls.screen ?? recto.urls.thumb!} alt={`Recto of ${accessionNumber}`} className="mx-auto max-h-80 w-auto object-contain" />
      <figcaption className="mt-1 text-xs text-ink-700">Recto{recto.capturedOn ? `, captured ${recto.capturedOn}` : ''}</figcaption>
    </figure>
  );
}

const ENCLOSURE_CODES = ['prussian_blue_in_buffered_enclosure', 'enclosure_failed_pat', 'buffering_unknown_for_prussian_blue', 'enclosure_without_pat'];

/** An enclosure warning offers rehousing to whoever may rehouse (conservators too): the rehouse action, with its preview, for this print. */
function RehouseOffer({ print }: { print: Print }) {
  const me = useMe();
  const [open, setOpen] = useState(false);
  if (!can(me.role, 'prints.move') || !print.warnings.some((w) => ENCLOSURE_CODES.includes(w.code))) return null;
  if (!open) {
    return (
      <div>
        <Button onClick={() => setOpen(true)}>Rehouse this print…</Button>
      </div>
    );
  }
  return (
    <BulkPanel
      action="rehouse"
      selection={{ kind: 'ids', ids: [print.id] }}
      selectionLabel={`print ${print.accessionNumber}`}
      onClose={() => setOpen(false)}
      onDone={() => {}}
      onRehouse={() => {}}
    />
  );
}

function PrintView({ print, panels }: { print: Print; panels: readonly PrintPagePanel[] }) {
  const me = useMe();
  // A deaccessioned print's record is read-only (the server refuses every change): no edit is offered.
  const mayWrite = can(me.role, 'catalogue.write') && print.status !== 'deaccessioned';
  const restricted = can(me.role, 'catalogue.read_restricted');
  const valuation = can(me.role, 'valuation.read');
  const chemistry = print.steps.some((s) => s.type === 'toning' || s.type === 'after_bath' || s.recipe);

  return (
    <article>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/catalogue">Prints</Link> <span aria-hidden="true">›</span> <span className="mono">{print.accessionNumber}</span>
      </nav>
      <header className="mb-5 flex flex-wrap items-end justify-between gap-3 border-b border-paper-300 pb-4">
        <div className="min-w-0">
          <h1 className="mono text-2xl sm:text-[1.75rem]">{print.accessionNumber}</h1>
          <p className="mt-1 font-serif text-lg text-ink-900">{print.title}</p>
          <p className="mt-1 text-xs text-ink-700">
            Version {print.version} · updated <time dateTime={print.updatedAt}>{formatDateTime(print.updatedAt)}</time>
          </p>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {mayWrite ? (
            <>
              <Link to={`/catalogue/prints/${print.id}/edit`} className={buttonClasses('primary', 'md', 'no-underline text-paper-50 hover:text-white')}>
                Edit
              </Link>
              <Link to={`/catalogue/prints/${print.id}/process`} className={buttonClasses('secondary', 'md', 'no-underline')}>
                Edit process history
              </Link>
            </>
          ) : null}
          {can(me.role, 'condition.read') || can(me.role, 'images.read') ? (
            <Link to={`/condition/prints/${print.id}`} className={buttonClasses('secondary', 'md', 'no-underline')}>
              Condition and images
            </Link>
          ) : null}
          <Link to={`/catalogue/prints/${print.id}/sheet`} className={buttonClasses('secondary', 'md', 'no-underline')}>
            Record sheet
          </Link>
          <a href={printJsonHref(print.id)} download className={buttonClasses('secondary', 'md', 'no-underline')}>
            Download JSON
          </a>
          {mayWrite ? <DeletePrintControl print={print} /> : null}
        </div>
      </header>

      {print.status === 'deaccessioned' ? (
        <div className="mb-5">
          <Notice tone="warning" title="Deaccessioned">
            <p>This print has left the collection. Its record is kept and can be read, but not changed; it is no longer inspected or lent. The deaccession record below says when, how and on whose authority.</p>
          </Notice>
        </div>
      ) : null}
      <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="flex min-w-0 flex-col gap-5">
          <PrintIdentity print={print} />
          <Panel title="Process history">
            <ProcessTimeline steps={print.steps} />
            {chemistry ? (
              <div className="mt-3">
                <ChemistryCaution />
              </div>
            ) : null}
          </Panel>
          <Panel title="Inscriptions, provenance and credit">
            <div className="flex flex-col gap-3">
              <TextBlock term="Inscriptions" value={print.inscriptions} />
              <TextBlock term="Provenance" value={print.provenance} />
              <TextBlock term="Credit line" value={print.creditLine} />
              <TextBlock term="Rights statement" value={rightsLabel(print.rights)} />
            </div>
          </Panel>
          {restricted && (print.staffNotes !== undefined || print.valuationAmount !== undefined) ? (
            <Panel title={valuation ? 'Staff notes and valuation' : 'Staff notes'}>
              <p className="mb-2 text-xs text-ink-700">{valuation ? 'Not shown to viewers; the valuation only to registrars and administrators.' : 'Not shown to viewers.'}</p>
              <div className="flex flex-col gap-3">
                <TextBlock term="Staff notes" value={print.staffNotes} />
                {valuation ? (
                  <TextBlock
                    term="Valuation"
                    value={print.valuationAmount !== null && print.valuationAmount !== undefined ? formatMoney(print.valuationAmount, print.valuationCurrency) : null}
                  />
                ) : null}
              </div>
            </Panel>
          ) : null}
          {panels.map((Extra, i) => (
            <Extra key={i} printId={print.id} />
          ))}
        </div>
        <div className="flex min-w-0 flex-col gap-5">
          <LatestRecto printId={print.id} accessionNumber={print.accessionNumber} />
          <WarningsPanel warnings={print.warnings} />
          {print.status !== 'deaccessioned' ? <RehouseOffer print={print} /> : null}
          {restricted ? <LocationPanel print={print} mayMove={can(me.role, 'prints.move') && print.status !== 'deaccessioned'} /> : null}
          <TimelinePanel printId={print.id} />
          {restricted ? <HistoryList printId={print.id} accessionNumber={print.accessionNumber} /> : null}
        </div>
      </div>
    </article>
  );
}

export function PrintPage({ panels = [] }: { panels?: readonly PrintPagePanel[] }) {
  const { id = '' } = useParams();
  const print = usePrint(id);
  useDocumentTitle(print.data ? `${print.data.accessionNumber} ${print.data.title}` : 'Print');
  if (print.isPending) return <Loading label="Loading the print…" />;
  if (print.isError) {
    const missing = isApiError(print.error) && print.error.code === 'not_found';
    return (
      <section className="max-w-2xl">
        <h1 className="text-2xl">{missing ? 'Print not found' : 'The print could not be loaded'}</h1>
        <div className="mt-3">
          {missing ? <p className="text-ink-700">There is no print with this address. It may have been deleted.</p> : <ErrorNotice error={print.error} />}
        </div>
        <p className="mt-4">
          <Link to="/catalogue">Back to the prints</Link>
        </p>
      </section>
    );
  }
  return <PrintView print={print.data} panels={panels} />;
}
