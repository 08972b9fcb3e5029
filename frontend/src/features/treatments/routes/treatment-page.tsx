import { Link, useParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { procedureLabelOf } from '@toneledger/common/fields/procedures';
import { TREATMENT_IMAGE_STAGE, TREATMENT_MATERIAL_KIND, TREATMENT_STATUS } from '@toneledger/common/schemas/procedure-vocab';
import type { Treatment } from '@toneledger/common/schemas/treatments';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useCompleteTreatment, useSignTreatment, useTreatment } from '@/features/treatments/api/treatments';
import { ApprovalForm, RecordForm, TreatmentAddendumForm } from '@/features/treatments/components/treatment-forms';

const ORDER: Treatment['status'][] = ['proposed', 'approved', 'done', 'signed'];

function Field({ label, value }: { label: string; value: string | number | null }) {
  return (
    <div>
      <dt className="text-sm text-ink-700">{label}</dt>
      <dd className="whitespace-pre-wrap">{value === null || value === '' ? '—' : value}</dd>
    </div>
  );
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="mb-5 rounded border border-paper-300 bg-white p-4" aria-label={title}>
      <h2 className="mb-3 text-lg">{title}</h2>
      {children}
    </section>
  );
}

/** The stages of a treatment as a list, the current one marked. */
function Stages({ status }: { status: Treatment['status'] }) {
  const at = ORDER.indexOf(status);
  return (
    <ol className="mb-4 flex flex-wrap gap-2 text-sm" aria-label="Stages">
      {ORDER.map((s, i) => (
        <li key={s} aria-current={s === status ? 'step' : undefined} className={`rounded border px-2 py-1 ${i <= at ? 'border-ink-700 font-medium' : 'border-paper-300 text-ink-700'}`}>
          {i + 1}. {TREATMENT_STATUS.labels[s]}{i < at ? ' ✓' : ''}
        </li>
      ))}
    </ol>
  );
}

/** One treatment from proposal to signed record: each stage's form in turn, then the locked record and its addenda. */
export function TreatmentPage() {
  const { id = '' } = useParams();
  const me = useMe();
  const q = useTreatment(id);
  const complete = useCompleteTreatment();
  const sign = useSignTreatment();
  useDocumentTitle(q.data ? `Treatment · ${q.data.accessionNumber}` : 'Treatment');
  if (q.isPending) return <Loading label="Loading…" />;
  if (q.isError) return <ErrorNotice error={q.error} title="The treatment could not be loaded." />;
  const t = q.data;
  const mine = can(me.role, 'treatments.write') && me.id === t.conservatorId;
  const writer = can(me.role, 'treatments.write');
  const failure = complete.error ?? sign.error;
  return (
    <article className="max-w-4xl">
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/condition/treatments">Treatments</Link> <span aria-hidden="true">›</span>{' '}
        <Link to={`/condition/prints/${t.printId}`} className="mono">{t.accessionNumber}</Link>
      </nav>
      <PageHeader title={`Treatment of ${t.accessionNumber}`} description={`${t.printTitle} · conservator ${t.conservator} · ${TREATMENT_STATUS.labels[t.status]}`} />
      <Stages status={t.status} />
      {failure ? <ErrorNotice error={failure} title="Not done." /> : null}
      {t.status === 'signed' ? (
        <Notice tone="info"><p>Signed by {t.signedBy} on {t.signedAt?.slice(0, 10)}. The record is locked; corrections are added below as addenda.</p></Notice>
      ) : null}

      <Section title="Proposal">
        <dl className="grid gap-3 sm:grid-cols-2">
          <Field label={procedureLabelOf('proposedOn')} value={t.proposedOn} />
          <Field label="Proposed by" value={t.proposedBy} />
          <Field label={procedureLabelOf('conditionFound')} value={t.conditionFound} />
          <Field label={procedureLabelOf('aims')} value={t.aims} />
          <Field label={procedureLabelOf('optionsConsidered')} value={t.optionsConsidered} />
          <Field label={procedureLabelOf('chosenMethod')} value={t.chosenMethod} />
        </dl>
      </Section>

      <Section title="Approval">
        {t.status === 'proposed' ? (
          mine ? <ApprovalForm treatment={t} /> : <p>Not approved yet.</p>
        ) : (
          <dl className="grid gap-3 sm:grid-cols-3">
            <Field label={procedureLabelOf('approvedByName')} value={t.approvedByName} />
            <Field label={procedureLabelOf('approvedOn')} value={t.approvedOn} />
            <Field label={procedureLabelOf('approvalNote')} value={t.approvalNote} />
          </dl>
        )}
      </Section>

      {t.status !== 'proposed' ? (
        <Section title="Treatment record">
          {(t.status === 'approved' || t.status === 'done') && mine ? (
            <RecordForm key={t.version} treatment={t} />
          ) : (
            <>
              <dl className="mb-3 grid gap-3 sm:grid-cols-3">
                <Field label={procedureLabelOf('startedOn')} value={t.startedOn} />
                <Field label={procedureLabelOf('completedOn')} value={t.completedOn} />
                <Field label={procedureLabelOf('hoursSpent')} value={t.hoursSpent} />
              </dl>
              <h3 className="font-medium">Steps</h3>
              <ol className="mb-3 list-decimal pl-6">
                {t.steps.map((s, i) => <li key={i}>{s.on}: {s.description}{s.minutes !== null ? ` (${s.minutes} min)` : ''}</li>)}
              </ol>
              <h3 className="font-medium">Materials and solvents</h3>
              <ul className="mb-3 list-disc pl-6">
                {t.materials.map((m, i) => <li key={i}>{TREATMENT_MATERIAL_KIND.labels[m.kind]}: {m.name}{m.batchOrProduct ? `, ${m.batchOrProduct}` : ''}{m.notes ? ` (${m.notes})` : ''}</li>)}
              </ul>
              <h3 className="font-medium">Images</h3>
              <ul className="mb-3 flex flex-wrap gap-3">
                {t.images.map((i) => (
                  <li key={i.imageId} className="text-sm">
                    {i.thumbUrl ? <img src={i.thumbUrl} alt={`${TREATMENT_IMAGE_STAGE.labels[i.stage]} treatment, ${i.viewType}`} className="h-20 w-20 object-contain" /> : null}
                    {TREATMENT_IMAGE_STAGE.labels[i.stage]} · {i.viewType}
                  </li>
                ))}
              </ul>
              <dl className="grid gap-3 sm:grid-cols-2">
                <Field label={procedureLabelOf('summary')} value={t.summary} />
                <div>
                  <dt className="text-sm text-ink-700">{procedureLabelOf('afterReportId')}</dt>
                  <dd>{t.afterReportId ? <Link to={`/condition/reports/${t.afterReportId}`}>Report of {t.afterReportExaminedOn}</Link> : '—'}</dd>
                </div>
              </dl>
            </>
          )}
          {mine && t.status === 'approved' ? (
            <div className="mt-3"><Button variant="primary" disabled={complete.isPending} onClick={() => complete.mutate({ id: t.id, version: t.version })}>Mark the treatment done</Button></div>
          ) : null}
          {mine && t.status === 'done' ? (
            <div className="mt-3 flex items-center gap-3">
              <Button variant="primary" disabled={sign.isPending} onClick={() => sign.mutate({ id: t.id, version: t.version })}>Sign and lock</Button>
              <span className="text-sm text-ink-700">Once signed, nothing can be changed; corrections go in addenda.</span>
            </div>
          ) : null}
        </Section>
      ) : null}

      {t.status === 'signed' ? (
        <Section title="Addenda">
          {t.addenda.length === 0 ? <p className="mb-3">None.</p> : (
            <ul className="mb-3">
              {t.addenda.map((a) => <li key={a.id} className="mb-2"><p className="whitespace-pre-wrap">{a.text}</p><p className="text-sm text-ink-700">{a.authorName}, {a.writtenAt.slice(0, 10)}</p></li>)}
            </ul>
          )}
          {writer ? <TreatmentAddendumForm treatment={t} /> : null}
        </Section>
      ) : null}
    </article>
  );
}
