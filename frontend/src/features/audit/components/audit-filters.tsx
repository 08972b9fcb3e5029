import { useEffect, useState, type FormEvent } from 'react';
import { auditListQuerySchema, type AuditListQuery } from '@toneledger/common/schemas/audit';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { issuesToFieldErrors } from '@/lib/forms/field-errors';
import { limitsOf } from '@/lib/forms/limits';

const FIELDS = ['action', 'entityType', 'entityId', 'actorId'] as const;
type FilterField = (typeof FIELDS)[number];
type Draft = Record<FilterField, string>;

const LABELS: Record<FilterField, string> = {
  action: 'Action',
  entityType: 'Record type',
  entityId: 'Record id',
  actorId: 'Person id',
};

function draftFrom(query: AuditListQuery): Draft {
  return { action: query.action ?? '', entityType: query.entityType ?? '', entityId: query.entityId ?? '', actorId: query.actorId ?? '' };
}

export function AuditFilters({ query, onChange }: { query: AuditListQuery; onChange: (patch: Partial<AuditListQuery>) => void }) {
  const [draft, setDraft] = useState<Draft>(() => draftFrom(query));
  const [errors, setErrors] = useState<Partial<Record<FilterField, string>>>({});
  const { action, entityType, entityId, actorId } = query;

  useEffect(() => {
    setDraft(draftFrom({ page: 1, pageSize: 50, action, entityType, entityId, actorId }));
    setErrors({});
  }, [action, entityType, entityId, actorId]);

  function submit(event: FormEvent) {
    event.preventDefault();
    const patch: Partial<AuditListQuery> = {};
    for (const field of FIELDS) patch[field] = draft[field].trim() || undefined;
    const parsed = auditListQuerySchema.safeParse({ ...query, ...patch });
    if (!parsed.success) {
      const found = issuesToFieldErrors(parsed.error.issues);
      const next: Partial<Record<FilterField, string>> = {};
      for (const field of FIELDS) if (found[field]) next[field] = field === 'actorId' ? 'A person id looks like 8-4-4-4-12 hexadecimal digits.' : found[field];
      setErrors(next);
      return;
    }
    setErrors({});
    onChange(patch);
  }

  const active = FIELDS.some((field) => query[field]);

  return (
    <form role="search" aria-label="Filter audit events" onSubmit={submit} noValidate className="mb-4 flex flex-wrap items-start gap-3">
      {FIELDS.map((field) => (
        <TextField
          key={field}
          label={LABELS[field]}
          value={draft[field]}
          error={errors[field]}
          onChange={(event) => setDraft((current) => ({ ...current, [field]: event.target.value }))}
          className={field === 'entityId' || field === 'actorId' ? 'mono' : undefined}
          fieldClassName={field === 'actorId' ? 'w-72' : 'w-40'}
          maxLength={limitsOf(auditListQuerySchema, field).maxLength}
          spellCheck={false}
        />
      ))}
      <div className="flex gap-2 pt-5">
        <Button type="submit" variant="primary">
          Filter
        </Button>
        {active ? (
          <Button variant="quiet" onClick={() => onChange({ action: undefined, entityType: undefined, entityId: undefined, actorId: undefined })}>
            Clear filters
          </Button>
        ) : null}
      </div>
    </form>
  );
}
