import { useFieldArray } from 'react-hook-form';
import { exhibitionInputSchema, exhibitionUpdateSchema, type ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { DateInput, TextAreaInput, TextInput, useFieldError } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { Button } from '@/components/ui/button';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useCreateExhibition, useUpdateExhibition } from '@/features/exhibitions/api/save-exhibition';

interface VenueValues {
  id?: string;
  name: string;
  place: string;
  opensOn: string;
  closesOn: string;
}

interface ExhibitionValues {
  title: string;
  organiser: string;
  summary: string;
  venues: VenueValues[];
}

const newVenue = (): VenueValues => ({ name: '', place: '', opensOn: '', closesOn: '' });

function toValues(e: ExhibitionDetail | null): ExhibitionValues {
  if (!e) return { title: '', organiser: '', summary: '', venues: [newVenue()] };
  return {
    title: e.title,
    organiser: e.organiser ?? '',
    summary: e.summary ?? '',
    venues: e.venues.map((v) => ({ id: v.id, name: v.name, place: v.place ?? '', opensOn: v.opensOn, closesOn: v.closesOn })),
  };
}

const VENUE_LABELS: Record<string, string> = { name: 'Venue', place: 'Place', opensOn: 'Opens', closesOn: 'Closes' };
const labelFor = (path: string, label: string | null) => {
  const match = /^venues\.(\d+)\.(\w+)/.exec(path);
  return match ? `Venue ${Number(match[1]) + 1} · ${VENUE_LABELS[match[2]!] ?? match[2]}` : label;
};

function Venues() {
  const rows = useFieldArray({ name: 'venues' });
  const listError = useFieldError('venues');
  return (
    <fieldset className="rounded border border-paper-300 bg-white px-4 pt-2 pb-4">
      <legend className="px-1 text-sm font-semibold text-ink-800">Venues, in order</legend>
      {listError ? <p className="mb-2 text-xs font-medium text-danger-700">{listError}</p> : null}
      <ol className="flex flex-col gap-3">
        {rows.fields.map((row, index) => (
          <li key={row.id} className="grid items-end gap-3 sm:grid-cols-[2fr_2fr_1fr_1fr_auto]">
            <TextInput name={`venues.${index}.name`} label="Venue" />
            <TextInput name={`venues.${index}.place`} label="Place" />
            <DateInput name={`venues.${index}.opensOn`} label="Opens" />
            <DateInput name={`venues.${index}.closesOn`} label="Closes" />
            <Button size="sm" variant="quiet" disabled={rows.fields.length === 1} onClick={() => rows.remove(index)} aria-label={`Remove venue ${index + 1}`}>
              Remove
            </Button>
          </li>
        ))}
      </ol>
      <Button size="sm" className="mt-3" onClick={() => rows.append(newVenue())}>
        Add a venue
      </Button>
    </fieldset>
  );
}

function Fields() {
  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextInput name="title" label="Title" />
        <TextInput name="organiser" label="Organiser" />
        <TextAreaInput name="summary" label="Summary" rows={3} fieldClassName="sm:col-span-2" />
      </div>
      <Venues />
    </div>
  );
}

/** A new exhibition, or the edit of one (the venues given replace the list). */
export function ExhibitionForm({ exhibition, onSaved, onCancel }: { exhibition: ExhibitionDetail | null; onSaved: (e: ExhibitionDetail) => void; onCancel: () => void }) {
  const create = useCreateExhibition();
  const update = useUpdateExhibition(exhibition?.id ?? '');
  const form = useSchemaForm({
    schema: exhibition ? exhibitionUpdateSchema : exhibitionInputSchema,
    defaultValues: toValues(exhibition),
    toBody: (v: ExhibitionValues) => (exhibition ? { ...v, version: exhibition.version } : v),
  });
  const busy = create.isPending || update.isPending;
  return (
    <SchemaForm
      form={form}
      aria-label={exhibition ? 'Edit exhibition' : 'New exhibition'}
      labelFor={labelFor}
      className="gap-4"
      onValid={(body) => {
        const options = { onSuccess: onSaved, onError: form.serverError };
        if (exhibition) update.mutate(body as never, options);
        else create.mutate(body as never, options);
      }}
    >
      <Fields />
      <SubmitCancel label={exhibition ? 'Save the exhibition' : 'Record the exhibition'} busy={busy} busyLabel="Saving…" onCancel={onCancel} />
    </SchemaForm>
  );
}
