import { useState } from 'react';
import type { CohortQuery, SavedQuery } from '@toneledger/common/schemas/research';
import { savedQueryInputSchema, savedQueryUpdateSchema } from '@toneledger/common/schemas/research';
import { CheckboxInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { useMe } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useDeleteSaved, useSavedQueries, useSaveQuery, useUpdateSaved } from '@/features/research/api/research';

interface SaveValues { name: string; description: string; shared: boolean }

/** Saves the query now in the URL, with a name, a description and whether other researchers see it. */
export function SaveQueryForm({ query, onSaved, onCancel }: { query: CohortQuery; onSaved: (saved: SavedQuery) => void; onCancel: () => void }) {
  const save = useSaveQuery();
  const form = useSchemaForm({
    schema: savedQueryInputSchema,
    defaultValues: { name: '', description: '', shared: false } as SaveValues,
    toBody: (v: SaveValues) => ({ ...v, query }),
  });
  return (
    <SchemaForm form={form} onValid={(body) => save.mutate(body, { onSuccess: onSaved, onError: form.serverError })} aria-label="Save the query" className="gap-3 rounded border border-paper-300 bg-white p-3">
      <TextInput name="name" label="Name" />
      <TextAreaInput name="description" label="Description" rows={2} />
      <CheckboxInput name="shared" label="Shared: every researcher can open it" />
      <SubmitCancel label="Save the query" busy={save.isPending} busyLabel="Saving…" onCancel={onCancel} size="sm" />
    </SchemaForm>
  );
}

/** My saved queries and those shared with me: open one (it goes into the URL); the owner renames or deletes it. */
export function SavedQueries({ onOpen }: { onOpen: (query: CohortQuery) => void }) {
  const [mine, setMine] = useState(false);
  const list = useSavedQueries(mine);
  return (
    <section aria-labelledby="saved-heading" className="flex flex-col gap-2">
      <div className="flex items-center justify-between gap-2">
        <h2 id="saved-heading" className="text-lg">Saved queries</h2>
        <label className="inline-flex items-center gap-1.5 text-sm">
          <input type="checkbox" checked={mine} onChange={(e) => setMine(e.target.checked)} /> Only mine
        </label>
      </div>
      {list.error ? <ErrorNotice error={list.error} title="The saved queries could not be listed." /> : null}
      {list.data && list.data.data.length === 0 ? <p className="text-sm text-ink-600">{mine ? 'You have saved no query yet.' : 'No saved query yet, of yours or shared.'}</p> : null}
      <ul className="flex flex-col gap-2">
        {list.data?.data.map((q) => <SavedRow key={q.id} saved={q} onOpen={onOpen} />)}
      </ul>
    </section>
  );
}

function SavedRow({ saved, onOpen }: { saved: SavedQuery; onOpen: (query: CohortQuery) => void }) {
  const me = useMe();
  const [renaming, setRenaming] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const remove = useDeleteSaved();
  const own = saved.owner.id === me.id;
  return (
    <li className="rounded border border-paper-200 bg-white p-2 text-sm" aria-label={saved.name}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <div>
          <span className="font-semibold">{saved.name}</span>
          {saved.shared ? <span className="ml-2 text-xs text-iron-700">shared</span> : null}
          <span className="block text-xs text-ink-600">{own ? 'Yours' : saved.owner.name}, {formatDateTime(saved.updatedAt)}</span>
        </div>
        <div className="flex gap-1">
          <Button size="sm" onClick={() => onOpen(saved.query)}>Open</Button>
          {own ? <Button size="sm" variant="quiet" onClick={() => setRenaming(true)}>Rename</Button> : null}
          {own ? <Button size="sm" variant="quiet" onClick={() => setConfirming(true)}>Delete</Button> : null}
        </div>
      </div>
      {saved.description ? <p className="mt-1 text-ink-700">{saved.description}</p> : null}
      {renaming ? <RenameForm saved={saved} onDone={() => setRenaming(false)} /> : null}
      {confirming ? (
        <Notice tone="warning" role="alert" title={`Delete “${saved.name}”?`}>
          <div className="mt-1 flex gap-2">
            <Button size="sm" variant="danger" disabled={remove.isPending} onClick={() => remove.mutate(saved, { onSuccess: () => setConfirming(false) })}>Delete it</Button>
            <Button size="sm" onClick={() => setConfirming(false)}>Keep it</Button>
          </div>
          {remove.error ? <ErrorNotice error={remove.error} title="Not deleted." /> : null}
        </Notice>
      ) : null}
    </li>
  );
}

interface RenameValues { name: string; description: string; shared: boolean; version: number }

function RenameForm({ saved, onDone }: { saved: SavedQuery; onDone: () => void }) {
  const update = useUpdateSaved();
  const form = useSchemaForm({ schema: savedQueryUpdateSchema, // Sharing is always sent as shown: the update schema's default would otherwise send "not shared".
  defaultValues: { name: saved.name, description: saved.description ?? '', shared: saved.shared, version: saved.version } as RenameValues });
  return (
    <SchemaForm form={form} onValid={(body) => update.mutate({ id: saved.id, body }, { onSuccess: onDone, onError: form.serverError })} aria-label={`Rename ${saved.name}`} className="mt-2 gap-2">
      <TextInput name="name" label="Name" />
      <TextAreaInput name="description" label="Description" rows={2} />
      <CheckboxInput name="shared" label="Shared: every researcher can open it" />
      <SubmitCancel label="Save" busy={update.isPending} busyLabel="Saving…" onCancel={onDone} size="sm" />
    </SchemaForm>
  );
}
