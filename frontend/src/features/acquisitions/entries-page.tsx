import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { entryLabelOf } from '@toneledger/common/fields/procedures';
import { entryInputSchema } from '@toneledger/common/schemas/acquisitions';
import { ACQUISITION_METHOD, ENTRY_REASON } from '@toneledger/common/schemas/procedure-vocab';
import { DateInput, NumberInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useAcquisitions, useCreateEntry, useEntries } from '@/features/acquisitions/api';
import { AcquisitionEditForm } from '@/features/acquisitions/edit-forms';

const today = () => new Date().toISOString().slice(0, 10);

function EntryForm({ onCancel }: { onCancel: () => void }) {
  const navigate = useNavigate();
  const create = useCreateEntry();
  const form = useSchemaForm({
    schema: entryInputSchema,
    defaultValues: { enteredOn: today(), depositor: '', depositorContact: '', reason: 'possible_acquisition', objectCount: '1', objectsDescription: '', returnBy: '', notes: '' },
  });
  return (
    <SchemaForm form={form} onValid={(body) => create.mutate(body, { onSuccess: (e) => navigate(`/catalogue/entries/${e.id}`), onError: form.serverError })} failureTitle="The entry was not saved." className="mb-6 max-w-3xl gap-3 rounded border border-paper-300 bg-white p-4">
      <h2 className="text-lg">New object entry</h2>
      <p className="text-sm text-ink-700">The entry number is given when it is saved (E, the year of entry, then the next number).</p>
      <DateInput name="enteredOn" label={entryLabelOf('enteredOn')} />
      <TextInput name="depositor" label={entryLabelOf('depositor')} />
      <TextAreaInput name="depositorContact" label={entryLabelOf('depositorContact')} rows={2} />
      <SelectInput name="reason" label={entryLabelOf('reason')} options={ENTRY_REASON.options} />
      <NumberInput name="objectCount" label={entryLabelOf('objectCount')} inputMode="numeric" />
      <TextAreaInput name="objectsDescription" label={entryLabelOf('objectsDescription')} rows={3} />
      <DateInput name="returnBy" label={entryLabelOf('returnBy')} />
      <TextAreaInput name="notes" label={entryLabelOf('notes')} rows={2} />
      <div className="flex gap-2">
        <Button type="submit" variant="primary" disabled={create.isPending}>Save and open the receipt</Button>
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </SchemaForm>
  );
}

/** Object entries and acquisitions: what came in, and what the collection acquired from it. */
export function EntriesPage() {
  useDocumentTitle('Entries and acquisitions');
  const me = useMe();
  const entries = useEntries();
  const acquisitions = useAcquisitions();
  const [adding, setAdding] = useState(false);
  const [editing, setEditing] = useState<string | null>(null);
  const writer = can(me.role, 'acquisitions.write');
  return (
    <section>
      <PageHeader
        title="Entries and acquisitions"
        description="Object entry records what comes in and gives the depositor a receipt; an acquisition records how title passed and links the accessioned prints."
        actions={writer && !adding ? <Button variant="primary" onClick={() => setAdding(true)}>New object entry</Button> : null}
      />
      {adding ? <EntryForm onCancel={() => setAdding(false)} /> : null}
      <h2 className="mb-2 text-lg">Object entries</h2>
      {entries.isPending ? <Loading label="Loading…" /> : entries.isError ? <ErrorNotice error={entries.error} /> : (
        <table className="mb-6 w-full text-sm">
          <thead><tr className="text-left"><th>Entry</th><th>Date</th><th>Depositor</th><th>Reason</th><th>Objects</th><th>Acquired</th></tr></thead>
          <tbody>
            {entries.data.map((e) => (
              <tr key={e.id} className="border-t border-paper-300">
                <td><Link to={`/catalogue/entries/${e.id}`} className="mono">{e.entryNumber}</Link></td>
                <td>{e.enteredOn}</td><td>{e.depositor}</td><td>{ENTRY_REASON.labels[e.reason]}</td><td>{e.objectCount}</td>
                <td>{e.acquisitions.length ? e.acquisitions.map((a) => `${ACQUISITION_METHOD.labels[a.method]} ${a.acquiredOn}`).join('; ') : '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <h2 className="mb-2 text-lg">Acquisitions</h2>
      {acquisitions.isPending ? <Loading label="Loading…" /> : acquisitions.isError ? <ErrorNotice error={acquisitions.error} /> : (
        <table className="w-full text-sm">
          <thead><tr className="text-left"><th>Acquired</th><th>Source</th><th>Method</th><th>Title document</th><th>Entry</th><th>Prints</th>{writer ? <th><span className="sr-only">Actions</span></th> : null}</tr></thead>
          <tbody>
            {acquisitions.data.map((a) => (
              <tr key={a.id} className="border-t border-paper-300">
                <td>{a.acquiredOn}</td><td>{a.source}</td><td>{ACQUISITION_METHOD.labels[a.method]}</td><td>{a.titleDocument ?? '—'}</td>
                <td>{a.entryId ? <Link to={`/catalogue/entries/${a.entryId}`} className="mono">{a.entryNumber}</Link> : '—'}</td>
                <td>{a.prints.map((p, i) => <span key={p.id}>{i ? ', ' : ''}<Link to={`/catalogue/prints/${p.id}`} className="mono">{p.accessionNumber}</Link></span>)}</td>
                {writer ? <td><Button size="sm" onClick={() => setEditing(a.id)} aria-label={`Edit the acquisition from ${a.source}, ${a.acquiredOn}`}>Edit</Button></td> : null}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {(() => {
        const a = editing ? acquisitions.data?.find((x) => x.id === editing) : undefined;
        return a ? (
          <div className="mt-3 max-w-3xl rounded border border-paper-300 bg-white p-4">
            <h2 className="text-lg">Edit the acquisition from {a.source}</h2>
            <AcquisitionEditForm acquisition={a} onDone={() => setEditing(null)} />
          </div>
        ) : null;
      })()}
    </section>
  );
}
