import { useId, type ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { rightsLabel } from '@toneledger/common/domain/rights';
import { can } from '@toneledger/common/domain/roles';
import { edtfAsWritten } from '@toneledger/common/domain/edtf-words';
import { PROCESS, STATUS, SUPPORT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { useMe } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { PrintFooter, printDate } from '@/lib/print-footer';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrint } from '@/lib/prints-api';
import { PrintLoadError } from '@/features/catalogue/components/print-load-error';
import { ProcessTimeline } from '@/features/catalogue/components/process-timeline';
import { formatDimensions, warningLabel } from '@/features/catalogue/utils/format';

function Section({ title, children }: { title: string; children: ReactNode }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="break-inside-avoid-page border-t border-paper-300 pt-3">
      <h2 id={id} className="mb-1.5 text-base font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[11rem_1fr] gap-3 py-0.5 text-sm">
      <dt className="font-semibold text-ink-700">{term}</dt>
      <dd className="text-ink-900">{children}</dd>
    </div>
  );
}

const none = 'Not recorded';

/**
 * The record sheet of one print, as a registrar files it: identity, making and materials, size,
 * process history, location and enclosure, warnings. Laid out for paper (A4, print stylesheet); the
 * footer of every printed page carries the accession number, the print date and "Page n of N".
 */
export function PrintSheetPage() {
  const { id = '' } = useParams();
  const print = usePrint(id);
  const me = useMe();
  useDocumentTitle(print.data ? `Record sheet ${print.data.accessionNumber}` : 'Record sheet');
  if (print.isPending) return <Loading label="Loading the print…" />;
  if (print.isError) return <PrintLoadError error={print.error} />;
  const p = print.data;
  const restricted = can(me.role, 'catalogue.read_restricted');
  const dims = (
    [
      ['Image', formatDimensions(p.imageHeightMm, p.imageWidthMm)],
      ['Sheet', formatDimensions(p.sheetHeightMm, p.sheetWidthMm)],
      ['Mount', formatDimensions(p.mountHeightMm, p.mountWidthMm)],
    ] as const
  ).filter(([, v]) => v);

  return (
    <article className="record-sheet mx-auto max-w-3xl bg-white p-6 print:max-w-none print:p-0">
      <PrintFooter accessionNumber={p.accessionNumber} />
      <div className="mb-4 flex items-center justify-between gap-3 print:hidden">
        <Link to={`/catalogue/prints/${p.id}`}>Back to the record</Link>
        <Button variant="primary" onClick={() => window.print()}>
          Print this sheet
        </Button>
      </div>
      <header className="mb-4">
        <p className="text-xs font-semibold tracking-wider text-ink-700 uppercase">Record sheet · printed {printDate()}</p>
        <h1 className="text-2xl">
          <span className="mono">{p.accessionNumber}</span> {p.title}
        </h1>
        <p className="text-xs text-ink-700">
          Version {p.version} · last changed {formatDateTime(p.updatedAt)}
        </p>
      </header>

      <div className="flex flex-col gap-4">
        <Section title="Identity">
          <dl>
            <Row term="Accession number">
              <span className="mono">{p.accessionNumber}</span>
            </Row>
            <Row term="Title">{p.title}</Row>
            <Row term="Maker">{p.maker?.name ?? none}</Row>
            <Row term="Date made">{p.dateMade ? `${edtfAsWritten(p.dateMade)} (EDTF ${p.dateMade})` : none}</Row>
            <Row term="Status">{STATUS.labels[p.status]}</Row>
            <Row term="Credit line">{p.creditLine ?? none}</Row>
            <Row term="Rights statement">{p.rights ? <>{rightsLabel(p.rights)} <span className="mono">{p.rights}</span></> : none}</Row>
          </dl>
        </Section>

        <Section title="Making and materials">
          <dl>
            <Row term="Process">{PROCESS.labels[p.process]}</Row>
            <Row term="Support">{p.support ? SUPPORT.labels[p.support] : none}</Row>
            <Row term="Paper">{p.paper?.label ?? none}</Row>
            <Row term="Toners">{p.tonerClasses.length ? p.tonerClasses.map((t) => TONER_CLASS.labels[t]).join(', ') : 'None recorded'}</Row>
            <Row term="Dimensions (h × w)">{dims.length ? dims.map(([k, v]) => `${k} ${v}`).join('; ') : none}</Row>
          </dl>
        </Section>

        <Section title="Process history">
          <ProcessTimeline steps={p.steps} />
        </Section>

        <Section title="Location and housing">
          <dl>
            {restricted ? <Row term="Location">{p.location?.pathLabel ?? none}</Row> : null}
            <Row term="Enclosure">{p.enclosure?.name ?? none}</Row>
          </dl>
        </Section>

        <Section title="Warnings">
          {p.warnings.length === 0 ? (
            <p className="text-sm text-ink-700">No warnings for this record.</p>
          ) : (
            <ul className="list-disc pl-5 text-sm">
              {p.warnings.map((w) => (
                <li key={w.code}>
                  <strong>{warningLabel(w.code)}</strong>
                  {w.message ? `: ${w.message}` : ''}
                </li>
              ))}
            </ul>
          )}
        </Section>

        {p.inscriptions || p.provenance ? (
          <Section title="Inscriptions and provenance">
            <dl>
              <Row term="Inscriptions">{p.inscriptions ?? none}</Row>
              <Row term="Provenance">{p.provenance ?? none}</Row>
            </dl>
          </Section>
        ) : null}
      </div>
    </article>
  );
}
