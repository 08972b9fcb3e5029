import { locationInputSchema, locationSchema, type Location } from '@toneledger/common/schemas/catalogue';
import { LOCATION_KIND } from '@toneledger/common/schemas/vocab';
import { SelectField, TextField } from '@/components/ui/field';
import { TextAreaField } from '@/components/ui/text-area-field';
import { useSaveLocation } from '@/features/reference/api/save-location';
import { FormActions, FormMessages } from '@/features/reference/components/form-messages';
import { selfAndDescendants, suggestedChildKind } from '@/features/reference/components/location-tree';
import { useRecordForm } from '@/features/reference/components/use-record-form';

type Kind = (typeof LOCATION_KIND.codes)[number];

interface LocationDraft extends Record<string, unknown> {
  name: string;
  kind: Kind;
  parentId: string;
  code: string;
  notes: string;
}

const LABELS: Record<string, string> = { name: 'Name', kind: 'Kind', parentId: 'Inside', code: 'Code', notes: 'Notes' };

function toBody(draft: LocationDraft) {
  return { ...draft, parentId: draft.parentId || null };
}

export interface LocationFormProps {
  location: Location | null;
  /** For a new place: where it goes. */
  parentId?: string | null;
  /** Every place, for the "Inside" choice. */
  all: Location[];
  onSaved: (location: Location, created: boolean) => void;
  onCancel: () => void;
}

export function LocationForm({ location, parentId = null, all, onSaved, onCancel }: LocationFormProps) {
  const save = useSaveLocation();
  const byId = new Map(all.map((l) => [l.id, l]));
  const toDraft = (record: Location | null): LocationDraft => ({
    name: record?.name ?? '',
    kind: record?.kind ?? suggestedChildKind(parentId ? byId.get(parentId)?.kind : null),
    parentId: record ? (record.parentId ?? '') : (parentId ?? ''),
    code: record?.code ?? '',
    notes: record?.notes ?? '',
  });
  const form = useRecordForm({ record: location, toDraft, toBody, schema: locationInputSchema, recordSchema: locationSchema, save, onSaved });
  const { draft, errors } = form;
  const excluded = location ? selfAndDescendants(all, location.id) : new Set<string>();
  const parent = draft.parentId ? byId.get(draft.parentId) : undefined;
  const newPath = [parent?.pathLabel, draft.name.trim() || '…'].filter(Boolean).join(' › ');

  return (
    <form onSubmit={form.submit} noValidate className="flex flex-col gap-3">
      <TextField label="Name" value={draft.name} onChange={(e) => form.set('name', e.target.value)} error={errors.name} maxLength={200} required />
      <div className="grid grid-cols-2 gap-3">
        <SelectField label="Kind" value={draft.kind} onChange={(e) => form.set('kind', e.target.value as Kind)} error={errors.kind}>
          {LOCATION_KIND.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <TextField label="Code" hint="Label on the shelf or box" value={draft.code} onChange={(e) => form.set('code', e.target.value)} error={errors.code} maxLength={50} className="mono" />
      </div>
      <SelectField
        label="Inside"
        hint={location ? 'Choose another place to move this one, with everything inside it.' : undefined}
        value={draft.parentId}
        onChange={(e) => form.set('parentId', e.target.value)}
        error={errors.parentId}
      >
        <option value="">Top level (not inside another place)</option>
        {all
          .filter((l) => !excluded.has(l.id))
          .map((l) => (
            <option key={l.id} value={l.id}>
              {l.pathLabel}
            </option>
          ))}
      </SelectField>
      <p className="text-sm text-ink-700">
        Full path: <span className="font-medium text-ink-900">{newPath}</span>
      </p>
      <TextAreaField label="Notes" value={draft.notes} onChange={(e) => form.set('notes', e.target.value)} error={errors.notes} maxLength={2000} />
      <FormMessages
        errors={errors}
        formError={form.formError}
        stale={form.stale}
        notice={form.notice}
        labelFor={(path) => LABELS[path] ?? path}
        describe={(field, value) => {
          if (value === '' || value == null) return field === 'parentId' ? 'Top level' : '(empty)';
          if (field === 'parentId') return byId.get(String(value))?.pathLabel ?? String(value);
          if (field === 'kind') return LOCATION_KIND.labels[value as Kind] ?? String(value);
          return String(value);
        }}
        onReapply={form.reapply}
        onDiscard={form.discardMine}
      />
      <FormActions saving={form.saving} onCancel={onCancel} />
    </form>
  );
}
