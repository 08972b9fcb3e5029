import { useState } from 'react';
import { savedSearchInputSchema, type SavedSearch } from '@toneledger/common/schemas/bulk';
import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { CheckboxInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useDeleteSavedSearch, useSavedSearches, useSaveSearch, useUpdateSavedSearch } from '@/features/catalogue/api/bulk';

interface SaveValues { name: string; shared: boolean }

/** The search's address (the list page with its filters): what a shared search's link points at. */
export function searchHref(query: SavedSearch['query']): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== '' && !(k === 'holding' && v === 'collection') && !(k === 'sort' && v === 'accessionNumber')) params.set(k, String(v));
  const text = params.toString();
  return `/catalogue${text ? `?${text}` : ''}`;
}

function SaveForm({ query, onDone }: { query: PrintListQuery; onDone: () => void }) {
  const save = useSaveSearch();
  const form = useSchemaForm({
    schema: savedSearchInputSchema,
    defaultValues: { name: '', shared: false } as SaveValues,
    toBody: (v: SaveValues) => ({ ...v, query: savedSearchInputSchema.shape.query.parse(query) }),
  });
  return (
    <SchemaForm form={form} onValid={(body) => save.mutate(body, { onSuccess: onDone, onError: form.serverError })} aria-label="Save this search" className="gap-2">
      <TextInput name="name" label="Name of the search" />
      <CheckboxInput name="shared" label="Shared: everyone who reads the catalogue sees it" />
      <SubmitCancel label="Save the search" busy={save.isPending} busyLabel="Saving…" onCancel={onDone} size="sm" />
    </SchemaForm>
  );
}

/** Saved searches, mine and shared: open one, save the current one, share or delete mine, copy a link. */
export function SavedSearches({ query, onOpen }: { query: PrintListQuery; onOpen: (query: SavedSearch['query']) => void }) {
  const list = useSavedSearches();
  const share = useUpdateSavedSearch();
  const remove = useDeleteSavedSearch();
  const [saving, setSaving] = useState(false);
  const [copied, setCopied] = useState<string | null>(null);
  return (
    <details className="rounded border border-paper-300 bg-white px-3 py-2 text-sm" data-testid="saved-searches">
      <summary className="cursor-pointer font-semibold">Saved searches{list.data ? ` (${list.data.length})` : ''}</summary>
      <div className="mt-2 flex flex-col gap-2">
        {list.error ? <ErrorNotice error={list.error} title="The saved searches could not be listed." /> : null}
        {list.data?.length === 0 ? <p className="text-ink-600">No saved search yet, of yours or shared.</p> : null}
        <ul className="flex flex-col gap-1">
          {list.data?.map((s) => (
            <li key={s.id} className="flex flex-wrap items-center gap-2">
              <Button size="sm" variant="quiet" onClick={() => onOpen(s.query)}>
                {s.name}
              </Button>
              <span className="text-xs text-ink-600">{s.mine ? (s.shared ? 'mine, shared' : 'mine') : `shared by ${s.owner.name}`}</span>
              {s.mine ? (
                <>
                  <Button size="sm" variant="quiet" onClick={() => share.mutate({ id: s.id, body: { version: s.version, shared: !s.shared } })}>
                    {s.shared ? 'Stop sharing' : 'Share'}
                  </Button>
                  <Button size="sm" variant="quiet" onClick={() => remove.mutate({ id: s.id, version: s.version })}>
                    Delete
                  </Button>
                </>
              ) : null}
              <Button
                size="sm"
                variant="quiet"
                onClick={() => {
                  void navigator.clipboard?.writeText(new URL(searchHref(s.query), window.location.origin).href);
                  setCopied(s.id);
                }}
              >
                {copied === s.id ? 'Link copied' : 'Copy link'}
              </Button>
            </li>
          ))}
        </ul>
        {share.error ? <ErrorNotice error={share.error} title="Not changed." /> : null}
        {remove.error ? <ErrorNotice error={remove.error} title="Not deleted." /> : null}
        {saving ? <SaveForm query={query} onDone={() => setSaving(false)} /> : (
          <div>
            <Button size="sm" onClick={() => setSaving(true)}>
              Save this search…
            </Button>
          </div>
        )}
      </div>
    </details>
  );
}
