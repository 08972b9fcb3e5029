import { displayInputSchema, displayUpdateSchema, type Display, type ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { DateInput, NumberInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useCreateDisplay, useUpdateDisplay } from '@/features/exhibitions/api/save-exhibition';
import { WeekdayToggles } from '@/features/exhibitions/components/weekday-toggles';
import {
  DISPLAY_LABELS as L, displayFieldFor, displayToValues, displayValuesToBody, emptyDisplayValues, type DisplayFormValues,
} from '@/features/exhibitions/utils/display-form';

function DisplayFields({ exhibition }: { exhibition: ExhibitionDetail }) {
  const venues = exhibition.venues.map((v) => ({ value: v.id, label: v.place ? `${v.name}, ${v.place}` : v.name }));
  return (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      <SelectInput name="venueId" label={L.venueId} options={venues} empty="No venue named" />
      <DateInput name="startsOn" label={L.startsOn} />
      <DateInput name="endsOn" label={L.endsOn} />
      <div />
      <NumberInput name="lux" label={L.lux} hint="On the object's surface." />
      <NumberInput name="hoursPerDay" label={L.hoursPerDay} hint="Lit hours on an open day." />
      <NumberInput name="uvMicrowattsPerLumen" label={L.uvMicrowattsPerLumen} hint="If measured." />
      <div />
      <div className="sm:col-span-2">
        <WeekdayToggles name="daysOpen" label={L.daysOpen} />
      </div>
      <TextAreaInput name="closedDates" label={L.closedDates} rows={2} hint="Holidays inside the period: one YYYY-MM-DD a line." fieldClassName="sm:col-span-2" />
      <TextInput name="caseOrFrame" label={L.caseOrFrame} fieldClassName="sm:col-span-2" />
      <TextAreaInput name="mountNotes" label={L.mountNotes} rows={2} fieldClassName="sm:col-span-2" />
    </div>
  );
}

const labelFor = (path: string, label: string | null) => L[path as keyof typeof L] ?? label;

export interface DisplayFormProps {
  exhibition: ExhibitionDetail;
  printId: string;
  accessionNumber: string;
  /** The display period to edit; absent for a new one. */
  display?: Display;
  onDone: () => void;
}

/** A display period of one print: dates, venue, light and hours, the days open, UV, case and mount. */
export function DisplayForm(props: DisplayFormProps) {
  return props.display ? <EditDisplay {...props} display={props.display} /> : <NewDisplay {...props} />;
}

function NewDisplay({ exhibition, printId, accessionNumber, onDone }: DisplayFormProps) {
  const create = useCreateDisplay(exhibition.id);
  const form = useSchemaForm({
    schema: displayInputSchema,
    defaultValues: emptyDisplayValues(printId, exhibition.venues.length === 1 ? exhibition.venues[0] : undefined),
    toBody: (v: DisplayFormValues) => displayValuesToBody(v, false),
    fieldFor: displayFieldFor,
  });
  return (
    <SchemaForm
      form={form}
      aria-label={`New display period of ${accessionNumber}`}
      labelFor={labelFor}
      failureTitle="The display period was not saved."
      className="gap-3 rounded border border-paper-300 bg-paper-50 p-3"
      onValid={(body) => create.mutate(body, { onSuccess: onDone, onError: form.serverError })}
    >
      <DisplayFields exhibition={exhibition} />
      <SubmitCancel label="Add the display period" busy={create.isPending} busyLabel="Saving…" onCancel={onDone} />
    </SchemaForm>
  );
}

function EditDisplay({ exhibition, accessionNumber, display, onDone }: DisplayFormProps & { display: Display }) {
  const update = useUpdateDisplay(exhibition.id);
  const form = useSchemaForm({
    schema: displayUpdateSchema,
    defaultValues: displayToValues(display),
    toBody: (v: DisplayFormValues) => ({ ...displayValuesToBody(v, true), version: display.version }),
    fieldFor: displayFieldFor,
  });
  return (
    <SchemaForm
      form={form}
      aria-label={`Display period of ${accessionNumber}`}
      labelFor={labelFor}
      failureTitle="The display period was not saved."
      className="gap-3 rounded border border-paper-300 bg-paper-50 p-3"
      onValid={(body) => update.mutate({ id: display.id, update: body }, { onSuccess: onDone, onError: form.serverError })}
    >
      <DisplayFields exhibition={exhibition} />
      <SubmitCancel label="Save the display period" busy={update.isPending} busyLabel="Saving…" onCancel={onDone} />
    </SchemaForm>
  );
}
