import { useEffect, useState, type FormEvent } from 'react';
import { auditListQuerySchema, type AuditListQuery } from '@toneledger/common/schemas/audit';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { issuesToFieldErrors } from '@/lib/forms/field-errors';
import { useAuditChoices } from '@/features/audit/api/get-audit-choices';

const FIELDS = ['actorId', 'action', 'from', 'to', 'entityType', 'entityId'] as const;
/** What the form edits; the record (`entityId`) is chosen from the table and shown as a chip. */
type FilterField = (typeof FIELDS)[number];
type Draft = Record<FilterField, string>;

const LABELS: Record<FilterField, string> = {
  actorId: 'Person',
  action: 'Action',
  from: 'From (day)',
  to: 'To (day)',
  entityType: 'Record type',
  entityId: 'Record',
};

function draftFrom(query: Partial<AuditListQuery>): Draft {
  return Object.fromEntries(FIELDS.map((f) => [f, query[f] ?? ''])) as Draft;
}

/**
 * The audit screen's filters: a person, an action and a kind of record picked from what the trail
 * holds, and a range of days (UTC, both ends included). Applied together with Filter; the URL holds
 * them, so a filtered view can be shared and exported as shown. One record, chosen from the table, is a
 * chip with its name (`recordName`) and ✕; its id is never typed or shown.
 */
export function AuditFilters({ query, onChange, recordName }: { query: AuditListQuery; onChange: (patch: Partial<AuditListQuery>) => void; recordName: string }) {
  const choices = useAuditChoices();
  const [draft, setDraft] = useState<Draft>(() => draftFrom(query));
  const [errors, setErrors] = useState<Partial<Record<FilterField, string>>>({});
  const key = FIELDS.map((f) => query[f] ?? '').join('|');

  useEffect(() => {
    setDraft(draftFrom(query));
    setErrors({});
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key]);

  function submit(event: FormEvent) {
    event.preventDefault();
    const patch: Partial<AuditListQuery> = {};
    for (const field of FIELDS) patch[field] = draft[field].trim() || undefined;
    // Another kind of record picked: the one record chosen before is not of it.
    if (patch.entityType !== query.entityType) patch.entityId = undefined;
    const parsed = auditListQuerySchema.safeParse({ ...query, ...patch });
    const next: Partial<Record<FilterField, string>> = {};
    if (!parsed.success) {
      const found = issuesToFieldErrors(parsed.error.issues);
      for (const field of FIELDS) if (found[field]) next[field] = found[field];
    }
    if (patch.from && patch.to && patch.from > patch.to && !next.to) next.to = 'The last day comes on or after the first';
    setErrors(next);
    if (Object.keys(next).length) return;
    onChange(patch);
  }

  const set = (field: FilterField) => (event: { target: { value: string } }) => setDraft((current) => ({ ...current, [field]: event.target.value }));
  const active = FIELDS.some((field) => query[field]);
  const people = choices.data?.people ?? [];
  const actions = choices.data?.actions ?? [];
  // A value in the URL that the pickers do not list (an old link) is still shown and kept.
  const personKnown = !draft.actorId || people.some((p) => p.id === draft.actorId);
  const actionKnown = !draft.action || actions.some((a) => a.code === draft.action);
  const kinds = choices.data?.recordKinds ?? [];
  const kindKnown = !draft.entityType || kinds.some((k) => k.code === draft.entityType);

  return (
    <form role="search" aria-label="Filter audit events" onSubmit={submit} noValidate className="mb-4 flex flex-wrap items-start gap-3">
      <SelectField label={LABELS.actorId} value={draft.actorId} onChange={set('actorId')} error={errors.actorId} fieldClassName="w-56">
        <option value="">Anyone</option>
        {people.map((p) => (
          <option key={p.id} value={p.id}>
            {p.name}
          </option>
        ))}
        {personKnown ? null : <option value={draft.actorId}>Person not listed</option>}
      </SelectField>
      <SelectField label={LABELS.action} value={draft.action} onChange={set('action')} error={errors.action} fieldClassName="w-64">
        <option value="">Any action</option>
        {actions.map((a) => (
          <option key={a.code} value={a.code}>
            {a.label}
          </option>
        ))}
        {actionKnown ? null : <option value={draft.action}>Action not listed</option>}
      </SelectField>
      <TextField type="date" label={LABELS.from} value={draft.from} onChange={set('from')} error={errors.from} fieldClassName="w-44" />
      <TextField type="date" label={LABELS.to} value={draft.to} onChange={set('to')} error={errors.to} fieldClassName="w-44" />
      <SelectField label={LABELS.entityType} value={draft.entityType} onChange={set('entityType')} error={errors.entityType} fieldClassName="w-52">
        <option value="">Any record</option>
        {kinds.map((k) => (
          <option key={k.code} value={k.code}>
            {k.label}
          </option>
        ))}
        {kindKnown ? null : <option value={draft.entityType}>Record type not listed</option>}
      </SelectField>
      {query.entityId ? (
        <div className="pt-5">
          <span className="inline-flex items-center gap-1 rounded-full border border-iron-200 bg-iron-50 py-1 pr-1 pl-3 text-sm text-ink-900">
            <span>Only this record: {recordName}</span>
            <button
              type="button"
              className="rounded-full px-1.5 text-iron-700 hover:bg-iron-100"
              aria-label={`Show every record, not only ${recordName}`}
              onClick={() => onChange({ entityId: undefined })}
            >
              <span aria-hidden="true">✕</span>
            </button>
          </span>
        </div>
      ) : null}
      <div className="flex gap-2 pt-5">
        <Button type="submit" variant="primary">
          Filter
        </Button>
        {active ? (
          <Button variant="quiet" onClick={() => onChange(Object.fromEntries(FIELDS.map((f) => [f, undefined])) as Partial<AuditListQuery>)}>
            Clear filters
          </Button>
        ) : null}
      </div>
    </form>
  );
}
