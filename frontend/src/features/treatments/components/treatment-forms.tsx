import { useFieldArray } from 'react-hook-form';
import { reportsApi } from '@toneledger/common/api/condition';
import { procedureLabelOf } from '@toneledger/common/fields/procedures';
import { TREATMENT_IMAGE_STAGE, TREATMENT_MATERIAL_KIND } from '@toneledger/common/schemas/procedure-vocab';
import { treatmentApprovalSchema, treatmentUpdateSchema, type Treatment } from '@toneledger/common/schemas/treatments';
import { addendumInputSchema } from '@toneledger/common/schemas/condition';
import { useQuery } from '@tanstack/react-query';
import { DateInput, NumberInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { callData } from '@/lib/api-client';
import { useImages } from '@/lib/images-api';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useApproveTreatment, useTreatmentAddendum, useUpdateTreatment } from '@/features/treatments/api/treatments';

const today = () => new Date().toISOString().slice(0, 10);

/** Who approved the proposal, and when. */
export function ApprovalForm({ treatment }: { treatment: Treatment }) {
  const approve = useApproveTreatment();
  const form = useSchemaForm({ schema: treatmentApprovalSchema, defaultValues: { approvedByName: '', approvedOn: today(), approvalNote: '', version: treatment.version } });
  return (
    <SchemaForm form={form} onValid={(body) => approve.mutate({ id: treatment.id, body: { ...body, version: treatment.version } }, { onError: form.serverError })} failureTitle="Not approved." className="gap-3">
      <TextInput name="approvedByName" label={procedureLabelOf('approvedByName')} hint="The person who approved it, by name and post." />
      <DateInput name="approvedOn" label={procedureLabelOf('approvedOn')} />
      <TextAreaInput name="approvalNote" label={procedureLabelOf('approvalNote')} rows={2} />
      <div><Button type="submit" variant="primary" disabled={approve.isPending}>Record the approval</Button></div>
    </SchemaForm>
  );
}

type RecordValues = {
  startedOn: string; completedOn: string; hoursSpent: string; summary: string; afterReportId: string;
  steps: { on: string; description: string; minutes: string }[];
  materials: { kind: string; name: string; batchOrProduct: string; notes: string }[];
  images: Record<string, string>;
  version: number;
};

/** The record of the work: dates, hours, dated steps, materials and solvents, images before/during/after, the report after. */
export function RecordForm({ treatment }: { treatment: Treatment }) {
  const update = useUpdateTreatment();
  const images = useImages(treatment.printId);
  const reports = useQuery({ queryKey: ['condition-reports', 'print', treatment.printId], queryFn: () => callData(reportsApi.list, { params: { id: treatment.printId } }) });
  const form = useSchemaForm({
    schema: treatmentUpdateSchema,
    defaultValues: {
      startedOn: treatment.startedOn ?? '', completedOn: treatment.completedOn ?? '', hoursSpent: treatment.hoursSpent?.toString() ?? '', summary: treatment.summary ?? '',
      afterReportId: treatment.afterReportId ?? '',
      steps: treatment.steps.map((s) => ({ on: s.on, description: s.description, minutes: s.minutes?.toString() ?? '' })),
      materials: treatment.materials.map((m) => ({ kind: m.kind, name: m.name, batchOrProduct: m.batchOrProduct ?? '', notes: m.notes ?? '' })),
      images: Object.fromEntries(treatment.images.map((i) => [i.imageId, i.stage])),
      version: treatment.version,
    } as RecordValues,
    toBody: (v: RecordValues) => ({
      ...v, version: treatment.version,
      images: Object.entries(v.images ?? {}).filter(([, stage]) => stage).map(([imageId, stage]) => ({ imageId, stage })),
    }),
  });
  const steps = useFieldArray({ control: form.control, name: 'steps' });
  const materials = useFieldArray({ control: form.control, name: 'materials' });
  const current = (images.data ?? []).filter((i) => !i.withdrawn);
  return (
    <SchemaForm form={form} onValid={(body) => update.mutate({ id: treatment.id, body }, { onError: form.serverError })} failureTitle="The record was not saved." className="gap-3">
      <div className="grid gap-3 sm:grid-cols-3">
        <DateInput name="startedOn" label={procedureLabelOf('startedOn')} />
        <DateInput name="completedOn" label={procedureLabelOf('completedOn')} />
        <NumberInput name="hoursSpent" label={`${procedureLabelOf('hoursSpent')} (h)`} inputMode="decimal" />
      </div>
      <fieldset className="rounded border border-paper-300 p-3">
        <legend className="px-1 font-medium">Steps of the work</legend>
        {steps.fields.map((f, i) => (
          <div key={f.id} className="mb-2 grid gap-2 sm:grid-cols-[10rem_1fr_7rem_auto] sm:items-end">
            <DateInput name={`steps.${i}.on`} label={`Step ${i + 1}: date`} />
            <TextInput name={`steps.${i}.description`} label={`Step ${i + 1}: what was done`} />
            <NumberInput name={`steps.${i}.minutes`} label="Minutes" inputMode="numeric" />
            <Button onClick={() => steps.remove(i)}>Remove step {i + 1}</Button>
          </div>
        ))}
        <Button onClick={() => steps.append({ on: today(), description: '', minutes: '' })}>Add a step</Button>
      </fieldset>
      <fieldset className="rounded border border-paper-300 p-3">
        <legend className="px-1 font-medium">Materials and solvents</legend>
        {materials.fields.map((f, i) => (
          <div key={f.id} className="mb-2 grid gap-2 sm:grid-cols-[9rem_1fr_1fr_1fr_auto] sm:items-end">
            <SelectInput name={`materials.${i}.kind`} label={`Item ${i + 1}: kind`} options={TREATMENT_MATERIAL_KIND.options} />
            <TextInput name={`materials.${i}.name`} label="Name" />
            <TextInput name={`materials.${i}.batchOrProduct`} label="Batch or product" />
            <TextInput name={`materials.${i}.notes`} label="Strength or use" />
            <Button onClick={() => materials.remove(i)}>Remove item {i + 1}</Button>
          </div>
        ))}
        <Button onClick={() => materials.append({ kind: 'material', name: '', batchOrProduct: '', notes: '' })}>Add a material or solvent</Button>
      </fieldset>
      <fieldset className="rounded border border-paper-300 p-3">
        <legend className="px-1 font-medium">Images of the print</legend>
        {current.length === 0 ? <p className="text-sm text-ink-700">This print has no images yet; upload them on its condition page.</p> : null}
        <div className="grid gap-2 sm:grid-cols-3">
          {current.map((img) => (
            <div key={img.id} className="flex items-end gap-2">
              {img.urls.thumb ? <img src={img.urls.thumb} alt="" className="h-16 w-16 object-contain" /> : null}
              <SelectInput name={`images.${img.id}`} label={`${img.viewType}${img.capturedOn ? `, ${img.capturedOn}` : ''}`} options={TREATMENT_IMAGE_STAGE.options} empty="Not part of it" />
            </div>
          ))}
        </div>
      </fieldset>
      <SelectInput
        name="afterReportId" label={procedureLabelOf('afterReportId')} empty="None yet"
        options={(reports.data ?? []).map((r) => ({ value: r.id, label: `${r.examinedOn} · ${r.status === 'signed' ? 'signed' : 'draft'} · ${r.examinerName}` }))}
      />
      <TextAreaInput name="summary" label={procedureLabelOf('summary')} rows={3} />
      <div><Button type="submit" variant="primary" disabled={update.isPending}>Save the record</Button></div>
    </SchemaForm>
  );
}

/** A dated, attributed correction to a signed treatment; the treatment itself is not changed. */
export function TreatmentAddendumForm({ treatment }: { treatment: Treatment }) {
  const add = useTreatmentAddendum();
  const form = useSchemaForm({ schema: addendumInputSchema, defaultValues: { text: '' } });
  return (
    <SchemaForm form={form} onValid={(body) => add.mutate({ id: treatment.id, text: body.text }, { onSuccess: () => form.reset({ text: '' }), onError: form.serverError })} failureTitle="The addendum was not added." className="gap-3">
      <TextAreaInput name="text" label="Addendum" rows={3} />
      <div><Button type="submit" variant="primary" disabled={add.isPending}>Add addendum</Button></div>
    </SchemaForm>
  );
}
