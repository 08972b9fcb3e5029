import { useEffect, useState, type FormEvent } from 'react';
import { auditListQuerySchema, type AuditListQuery } from '@toneledger/common/schemas/audit';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { issuesToFieldErrors } from '@/lib/forms/field-errors';
import { limitsOf } from '@/lib/forms/limits';
import { useAuditChoices } from '@/features/audit/api/get-audit-choices';

const FIELDS = ['actorId', 'action', 'from', 'to', 'entityType', 'entityId'] as const;
type FilterField = (typeof FIELDS)[number];
type Draft = Record<FilterField, string>;

const LABELS: Record<FilterField, string> = {
  actorId: 'Person',
  action: 'Action',
  from: 'From (day)',
  to: 'To (day)',
  entityType: 'Record type',
  entityId: 'Record id',
};

function draftFrom(query: Partial<AuditListQuery>): Draft {
  return Object.fromEntries(FIELDS.map((f) => [f, query[f] ?? ''])) as Draft;
}

/**
 * The audit screen's filters: a person and an action picked from what the trail holds, a range of
 * days (UTC, both ends included), and a record by type and id. Applied together with Filter; the
 * URL holds them, so a filtered view can be shared and exported as shown.
 */
export function AuditFilters({ query, onChange }: { query: AuditListQuery; onChange: (patch: Partial<AuditListQuery>) => void }) {
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
      <TextField
        label={LABELS.entityType}
        value={draft.entityType}
        onChange={set('entityType')}
        error={errors.entityType}
        fieldClassName="w-36"
        maxLength={limitsOf(auditListQuerySchema, 'entityType').maxLength}
        spellCheck={false}
      />
      <TextField
        label={LABELS.entityId}
        value={draft.entityId}
        onChange={set('entityId')}
        error={errors.entityId}
        className="mono"
        fieldClassName="w-40"
        maxLength={limitsOf(auditListQuerySchema, 'entityId').maxLength}
        spellCheck={false}
      />
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
