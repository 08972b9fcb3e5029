import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { acquisitionLabelOf, entryLabelOf } from '@toneledger/common/fields/procedures';
import { acquisitionInputSchema } from '@toneledger/common/schemas/acquisitions';
import { ACQUISITION_METHOD, ENTRY_REASON } from '@toneledger/common/schemas/procedure-vocab';
import { DateInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { useMe } from '@/lib/auth';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useDocumentTitle } from '@/lib/use-document-title';
import { printIdByAccession, useAcquisitions, useCreateAcquisition, useEntry, useLinkPrints } from '@/features/acquisitions/api';
import { AcquisitionEditForm, EntryEditForm } from '@/features/acquisitions/edit-forms';

const today = () => new Date().toISOString().slice(0, 10);

function AcquisitionForm({ entryId, depositor }: { entryId: string; depositor: string }) {
  const create = useCreateAcquisition();
  const form = useSchemaForm({
    schema: acquisitionInputSchema,
    defaultValues: { entryId, source: depositor, method: 'gift', approvedOn: '', acquiredOn: today(), titleDocument: '', funds: '', notes: '' },
  });
  return (
    <SchemaForm form={form} onValid={(body) => create.mutate(body, { onSuccess: () => form.reset(), onError: form.serverError })} failureTitle="The acquisition was not saved." className="gap-3">
      <TextInput name="source" label={acquisitionLabelOf('source')} />
      <SelectInput name="method" label={acquisitionLabelOf('method')} options={ACQUISITION_METHOD.options} />
      <DateInput name="approvedOn" label={acquisitionLabelOf('approvedOn')} />
      <DateInput name="acquiredOn" label={acquisitionLabelOf('acquiredOn')} />
      <TextInput name="titleDocument" label={acquisitionLabelOf('titleDocument')} />
      <TextInput name="funds" label={acquisitionLabelOf('funds')} />
      <TextAreaInput name="notes" label={acquisitionLabelOf('notes')} rows={2} />
      <div><Button type="submit" variant="primary" disabled={create.isPending}>Record the acquisition</Button></div>
    </SchemaForm>
  );
}

/** Accessioning: adds a catalogued print to the acquisition by its accession number. */
function LinkPrint({ acquisition }: { acquisition: { id: string; version: number } }) {
  const link = useLinkPrints();
  const [value, setValue] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  async function add() {
    setProblem(null);
    const id = await printIdByAccession(value.trim());
    if (!id) { setProblem(`No print has the accession number ${value.trim()}.`); return; }
    link.mutate({ id: acquisition.id, body: { add: [id], remove: [], version: acquisition.version } }, { onSuccess: () => setValue(''), onError: (e) => setProblem(e instanceof Error ? e.message : 'Not linked.') });
  }
  return (
    <div className="mt-2 flex flex-wrap items-end gap-2 print:hidden">
      <label className="flex flex-col text-sm">Accession number of a catalogued print
        <input className="rounded border border-paper-300 px-2 py-1" value={value} onChange={(e) => setValue(e.target.value)} />
      </label>
      <Button onClick={add} disabled={!value.trim() || link.isPending}>Link to this acquisition</Button>
      {problem ? <p role="alert" className="text-sm text-red-800">{problem}</p> : null}
    </div>
  );
}

/** One object entry: its receipt (printable), the acquisitions that followed and the prints they accessioned. */
export function EntryPage() {
  const { id = '' } = useParams();
  const me = useMe();
  const q = useEntry(id);
  const acquisitions = useAcquisitions();
  const [editing, setEditing] = useState<string | null>(null);
  useDocumentTitle(q.data ? `Object entry ${q.data.entryNumber}` : 'Object entry');
  if (q.isPending) return <Loading label="Loading…" />;
  if (q.isError) return <ErrorNotice error={q.error} title="The entry could not be loaded." />;
  const e = q.data;
  const writer = can(me.role, 'acquisitions.write');
  const mine = (acquisitions.data ?? []).filter((a) => a.entryId === e.id);
  return (
    <article className="max-w-3xl">
      <nav aria-label="Breadcrumb" className="mb-2 text-sm print:hidden"><Link to="/catalogue/entries">Entries and acquisitions</Link></nav>
      <section aria-label="Receipt" className="rounded border border-paper-300 bg-white p-5">
        <h1 className="text-xl">Receipt for objects left with the collection</h1>
        <p className="mono mb-3 text-lg">{e.entryNumber}</p>
        <dl className="grid gap-2 sm:grid-cols-2">
          <div><dt className="text-sm text-ink-700">{entryLabelOf('enteredOn')}</dt><dd>{e.enteredOn}</dd></div>
          <div><dt className="text-sm text-ink-700">{entryLabelOf('reason')}</dt><dd>{ENTRY_REASON.labels[e.reason]}</dd></div>
          <div><dt className="text-sm text-ink-700">{entryLabelOf('depositor')}</dt><dd>{e.depositor}</dd></div>
          <div><dt className="text-sm text-ink-700">{entryLabelOf('depositorContact')}</dt><dd className="whitespace-pre-wrap">{e.depositorContact ?? '—'}</dd></div>
          <div><dt className="text-sm text-ink-700">{entryLabelOf('objectCount')}</dt><dd>{e.objectCount}</dd></div>
          <div><dt className="text-sm text-ink-700">{entryLabelOf('returnBy')}</dt><dd>{e.returnBy ?? '—'}</dd></div>
        </dl>
        <h2 className="mt-3 font-medium">{entryLabelOf('objectsDescription')}</h2>
        <p className="whitespace-pre-wrap">{e.objectsDescription}</p>
        <p className="mt-4 text-sm">Received by {e.receivedBy}. The objects are held for the reason above and remain the depositor&rsquo;s property until title passes in writing.</p>
        <div className="mt-8 grid grid-cols-2 gap-8 text-sm">
          <p className="border-t border-ink-700 pt-1">Signed for the collection</p>
          <p className="border-t border-ink-700 pt-1">Signed by the depositor</p>
        </div>
      </section>
      <div className="my-3 flex gap-2 print:hidden">
        <Button onClick={() => window.print()}>Print the receipt</Button>
        {writer && editing !== e.id ? <Button onClick={() => setEditing(e.id)}>Edit entry</Button> : null}
      </div>
      {writer && editing === e.id ? <EntryEditForm entry={e} onDone={() => setEditing(null)} /> : null}
      <section aria-label="Acquisitions" className="mt-4 print:hidden">
        <h2 className="mb-2 text-lg">Acquisitions from this entry</h2>
        {mine.length === 0 ? <p className="mb-3">None yet.</p> : mine.map((a) => (
          <div key={a.id} className="mb-3 rounded border border-paper-300 bg-white p-3 text-sm">
            <p className="font-medium">{ACQUISITION_METHOD.labels[a.method]} from {a.source}, acquired {a.acquiredOn}{a.approvedOn ? ` (approved ${a.approvedOn})` : ''}</p>
            <p>{acquisitionLabelOf('titleDocument')}: {a.titleDocument ?? '—'} · {acquisitionLabelOf('funds')}: {a.funds ?? '—'}</p>
            <p>Accessioned prints: {a.prints.length ? a.prints.map((p, i) => <span key={p.id}>{i ? ', ' : ''}<Link to={`/catalogue/prints/${p.id}`} className="mono">{p.accessionNumber}</Link></span>) : 'none yet'}</p>
            {writer && editing !== a.id ? <Button size="sm" className="mt-2" onClick={() => setEditing(a.id)}>Edit acquisition</Button> : null}
            {writer && editing === a.id ? <AcquisitionEditForm acquisition={a} onDone={() => setEditing(null)} /> : null}
            {writer ? <LinkPrint acquisition={a} /> : null}
          </div>
        ))}
        {writer ? <details className="rounded border border-paper-300 bg-white p-3"><summary>Record an acquisition</summary><AcquisitionForm key={e.depositor} entryId={e.id} depositor={e.depositor} /></details> : null}
      </section>
    </article>
  );
}
