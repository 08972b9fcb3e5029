import { useWatch } from 'react-hook-form';
import { locationInputSchema, locationSchema, type Location } from '@toneledger/common/schemas/catalogue';
import { LOCATION_KIND } from '@toneledger/common/schemas/vocab';
import { SchemaForm } from '@/components/form/schema-form';
import { SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { fieldList } from '@/lib/forms/stale-edit';
import { useSaveLocation } from '@/features/reference/api/save-location';
import { FormActions } from '@/features/reference/components/form-actions';
import { selfAndDescendants, suggestedChildKind } from '@/features/reference/components/location-tree';
import { useRecordForm } from '@/features/reference/components/use-record-form';

type Kind = (typeof LOCATION_KIND.codes)[number];

interface LocationValues {
  name: string;
  kind: Kind;
  parentId: string;
  code: string;
  notes: string;
}

const LABELS: Record<keyof LocationValues, string> = { name: 'Name', kind: 'Kind', code: 'Code', parentId: 'Inside', notes: 'Notes' };

export interface LocationFormProps {
  location: Location | null;
  /** For a new place: where it goes. */
  parentId?: string | null;
  /** Every place, for the "Inside" choice. */
  all: Location[];
  onSaved: (location: Location, created: boolean) => void;
  onCancel: () => void;
}

function FullPath({ byId }: { byId: Map<string, Location> }) {
  const [parentId, name] = useWatch<LocationValues, ['parentId', 'name']>({ name: ['parentId', 'name'] });
  const parent = parentId ? byId.get(parentId) : undefined;
  const path = [parent?.pathLabel, (name ?? '').trim() || '…'].filter(Boolean).join(' › ');
  return (
    <p className="text-sm text-ink-700">
      Full path: <span className="font-medium text-ink-900">{path}</span>
    </p>
  );
}

export function LocationForm({ location, parentId = null, all, onSaved, onCancel }: LocationFormProps) {
  const save = useSaveLocation();
  const byId = new Map(all.map((l) => [l.id, l]));
  const toValues = (record: Location | null): LocationValues => ({
    name: record?.name ?? '',
    kind: record?.kind ?? suggestedChildKind(parentId ? byId.get(parentId)?.kind : null),
    parentId: record ? (record.parentId ?? '') : (parentId ?? ''),
    code: record?.code ?? '',
    notes: record?.notes ?? '',
  });
  const describe = (key: string, values: LocationValues): string => {
    if (key === 'parentId') return values.parentId ? (byId.get(values.parentId)?.pathLabel ?? values.parentId) : 'Top level';
    if (key === 'kind') return LOCATION_KIND.labels[values.kind] ?? values.kind;
    return values[key as keyof LocationValues] ?? '';
  };
  const { form, edit, onValid, saving } = useRecordForm({
    record: location,
    schema: locationInputSchema,
    recordSchema: locationSchema,
    toValues,
    describe,
    fields: fieldList(LABELS),
    save,
    onSaved,
  });
  const excluded = location ? selfAndDescendants(all, location.id) : new Set<string>();

  return (
    <SchemaForm form={form} edit={edit} onValid={onValid} className="gap-3">
      <TextInput name="name" label={LABELS.name} required />
      <div className="grid grid-cols-2 gap-3">
        <SelectInput name="kind" label={LABELS.kind} options={LOCATION_KIND.options} />
        <TextInput name="code" label={LABELS.code} hint="Label on the shelf or box" className="mono" />
      </div>
      <SelectInput
        name="parentId"
        label={LABELS.parentId}
        hint={location ? 'Choose another place to move this one, with everything inside it.' : undefined}
        empty="Top level (not inside another place)"
        options={all.filter((l) => !excluded.has(l.id)).map((l) => ({ value: l.id, label: l.pathLabel }))}
      />
      <FullPath byId={byId} />
      <TextAreaInput name="notes" label={LABELS.notes} />
      <FormActions saving={saving} onCancel={onCancel} />
    </SchemaForm>
  );
}
