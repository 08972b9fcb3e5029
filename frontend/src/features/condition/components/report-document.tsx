import { useId, type ReactNode } from 'react';
import type { Print } from '@toneledger/common/schemas/catalogue';
import { CONDITION_CONTEXT_LABELS, GRADE_LABELS, type ConditionReport, type ConditionTerm, type GradeDefinitions } from '@toneledger/common/schemas/condition';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { TableHead } from '@/components/ui/table-head';
import { formatDateTime } from '@/lib/format';
import { describeConditions } from '@/lib/loan-conditions';
import { imageLabel } from '@/features/condition/components/region-drawer';
import { PrintIdentityLine } from '@/features/condition/components/print-identity-line';
import { RegionOverlay, type MarkedRegion } from '@/features/condition/components/region-overlay';
import { LoanBlock } from '@/features/condition/components/report-loan';
import { SignatureBlock } from '@/features/condition/components/signature-block';
import { formatDay } from '@/features/condition/utils/format';
import { AREA_LABELS, EXTENT_LABELS, SEVERITY_LABELS, SIDE_LABELS, label } from '@/features/condition/utils/labels';
import { describeRegion } from '@/features/condition/utils/region';

export interface ReportDocumentProps {
  report: ConditionReport;
  print?: Print;
  images: PrintImage[];
  terms: ConditionTerm[];
  definitions: GradeDefinitions;
  institutionName?: string;
}

function Block({ title, children }: { title: string; children: ReactNode }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="break-inside-avoid">
      <h2 id={id} className="mb-1 text-lg">
        {title}
      </h2>
      {children}
    </section>
  );
}

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[9rem_1fr] gap-3 border-b border-paper-200 py-1 last:border-b-0">
      <dt className="text-xs font-semibold tracking-wide text-ink-700 uppercase">{term}</dt>
      <dd className="text-sm">{children}</dd>
    </div>
  );
}

/** The print's recto image (else any) with a display copy, shown small at the head of the report. */
function leadImage(images: PrintImage[]): PrintImage | undefined {
  const usable = images.filter((i) => !i.withdrawn && i.urls.thumb);
  return usable.find((i) => i.viewType === 'recto') ?? usable[0];
}

/** A condition report as it reads and prints: identity, grade and its definition, observations with their regions, advice, addenda. */
export function ReportDocument({ report, print, images, terms, definitions, institutionName }: ReportDocumentProps) {
  const lead = leadImage(images);
  const observations = [...report.observations].sort((a, b) => a.position - b.position);
  const byImage = new Map<string, MarkedRegion[]>();
  observations.forEach((o, index) => {
    if (!o.region) return;
    const list = byImage.get(o.region.imageId) ?? [];
    list.push({ number: index + 1, region: o.region });
    byImage.set(o.region.imageId, list);
  });
  const termLabel = (code: string, fallback: string) => terms.find((t) => t.code === code)?.label ?? fallback;

  return (
    <article aria-label="Condition report" className="flex flex-col gap-5 rounded border border-paper-300 bg-white p-5 print:border-0 print:p-0">
      <div className="hidden print:block">
        <p className="font-serif text-xl font-semibold">{institutionName ?? ''}</p>
        <p className="text-sm">Condition report</p>
      </div>
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div className="min-w-0">
          {print ? (
            <PrintIdentityLine print={print} level="p" />
          ) : (
            <p>
              <span className="mono">{report.accessionNumber}</span> {report.printTitle}
            </p>
          )}
        </div>
        {lead?.urls.thumb ? <img src={lead.urls.thumb} alt={`${imageLabel(lead)} of ${report.accessionNumber}`} className="h-auto max-h-40 w-auto max-w-40 border border-paper-300" /> : null}
      </div>

      <dl className="rounded border border-paper-200 px-3 py-1">
        <Row term="Examined on">{formatDay(report.examinedOn)}</Row>
        <Row term="Context">{CONDITION_CONTEXT_LABELS[report.context]}</Row>
        <Row term="Examiner">{report.examinerName}</Row>
        <Row term="Status">
          {report.status === 'signed' ? (
            <strong>
              Signed on <time dateTime={report.signedAt ?? undefined}>{formatDateTime(report.signedAt)}</time> by {report.examinerName}
            </strong>
          ) : (
            'Draft (not signed)'
          )}
        </Row>
        <Row term="Next check">{report.nextCheckOn ? formatDay(report.nextCheckOn) : 'Not proposed'}</Row>
      </dl>

      {report.loan ? <LoanBlock loan={report.loan} conditions={describeConditions(report.loan.conditions)} /> : null}

      <Block title="Overall grade">
        {report.grade ? (
          <p className="text-sm">
            <strong className="font-semibold">{GRADE_LABELS[report.grade]}</strong> — {definitions[report.grade]}
          </p>
        ) : (
          <p className="text-sm text-ink-700">Not graded yet.</p>
        )}
      </Block>

      <Block title="Observations">
        {observations.length === 0 ? (
          <p className="text-sm text-ink-700">No observations recorded.</p>
        ) : (
          <table className="w-full border-collapse text-left text-sm">
            <TableHead columns={['No.', 'Observed', 'Where', 'Extent', 'Severity', 'Notes']} />
            <tbody>
              {observations.map((o, index) => (
                <tr key={o.id} className="border-t border-paper-200 align-top break-inside-avoid">
                  <td className="num px-2 py-1.5">{index + 1}</td>
                  <th scope="row" className="px-2 py-1.5 font-medium">
                    {termLabel(o.termCode, o.termLabel)}
                  </th>
                  <td className="px-2 py-1.5">
                    {label(SIDE_LABELS, o.side)}, {label(AREA_LABELS, o.area).toLowerCase()}
                    {o.region ? <span className="block text-xs text-ink-700">{describeRegion(o.region)} marked</span> : null}
                  </td>
                  <td className="px-2 py-1.5">{o.extent === 'percentage' ? `${o.extentPercent ?? '?'} %` : label(EXTENT_LABELS, o.extent)}</td>
                  <td className="px-2 py-1.5">{label(SEVERITY_LABELS, o.severity)}</td>
                  <td className="px-2 py-1.5 whitespace-pre-line">{o.notes ?? ''}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {byImage.size > 0 ? (
          <div className="mt-3 grid gap-4 sm:grid-cols-2 print:grid-cols-2">
            {[...byImage.entries()].map(([imageId, regions]) => {
              const image = images.find((i) => i.id === imageId);
              return image ? (
                <div key={imageId}>
                  <RegionOverlay image={image} regions={regions} alt={`${imageLabel(image)}, with observations ${regions.map((r) => r.number).join(', ')} marked`} />
                  <p className="mt-1 text-xs text-ink-700">{imageLabel(image)}: observations {regions.map((r) => r.number).join(', ')}</p>
                </div>
              ) : (
                <p key={imageId} className="text-sm text-ink-700">
                  Observations {regions.map((r) => r.number).join(', ')} are marked on an image that is no longer shown.
                </p>
              );
            })}
          </div>
        ) : null}
      </Block>

      <Block title="Summary">
        <p className="text-sm whitespace-pre-line">{report.summary ?? <span className="text-ink-600">None written.</span>}</p>
      </Block>
      <Block title="Recommendations">
        <p className="text-sm whitespace-pre-line">{report.recommendations ?? <span className="text-ink-600">None written.</span>}</p>
        <p className="mt-1 text-xs text-ink-700">Advice only: treatment decisions rest with qualified conservators.</p>
      </Block>

      <Block title={`Addenda (${report.addenda.length})`}>
        {report.addenda.length === 0 ? (
          <p className="text-sm text-ink-700">None.</p>
        ) : (
          <ol className="flex flex-col gap-2">
            {report.addenda.map((a) => (
              <li key={a.id} className="border-l-2 border-sepia-200 pl-3 text-sm break-inside-avoid">
                <p className="text-xs text-ink-700">
                  <time dateTime={a.writtenAt}>{formatDateTime(a.writtenAt)}</time> · {a.authorName}
                </p>
                <p className="whitespace-pre-line">{a.text}</p>
              </li>
            ))}
          </ol>
        )}
      </Block>

      <div className="hidden print:block">
        <SignatureBlock report={report} />
      </div>
    </article>
  );
}
