import { roundInputSchema, type RoundDetail } from '@toneledger/common/schemas/inspections';
import { DateInput, SelectInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useAssignees, useCreateRound } from '@/features/inspections/api/rounds';

export interface RoundPlanValues {
  title: string;
  plannedOn: string;
  assigneeId: string;
  printIds: string[];
}

/**
 * "Plan these checks": a title, a day and a conservator for the chosen prints. The prints travel in
 * the form's values and are sent as they are; the schema checks the rest.
 */
export function RoundPlanForm({ printIds, defaultTitle, defaultAssigneeId, defaultDate, onPlanned, onCancel }: {
  printIds: string[];
  defaultTitle: string;
  defaultAssigneeId: string;
  defaultDate: string;
  onPlanned: (round: RoundDetail) => void;
  onCancel: () => void;
}) {
  const assignees = useAssignees();
  const create = useCreateRound();
  const form = useSchemaForm({
    schema: roundInputSchema,
    defaultValues: { title: defaultTitle, plannedOn: defaultDate, assigneeId: defaultAssigneeId, printIds } satisfies RoundPlanValues,
  });
  return (
    <SchemaForm
      form={form}
      className="gap-3 rounded border border-paper-300 bg-paper-100 p-3 print:hidden"
      aria-label="Plan these checks"
      failureTitle="The round was not planned."
      onValid={(body) => create.mutate(body, { onSuccess: onPlanned, onError: (error) => form.serverError(error) })}
    >
      <p className="text-sm text-ink-700">
        {printIds.length} {printIds.length === 1 ? 'print' : 'prints'} chosen.
      </p>
      <TextInput name="title" label="Title" fieldClassName="max-w-md" />
      <DateInput name="plannedOn" label="Day of the round" fieldClassName="max-w-xs" />
      <SelectInput
        name="assigneeId"
        label="Carried out by"
        empty="Choose a person"
        options={(assignees.data ?? []).map((a) => ({ value: a.id, label: a.name }))}
        fieldClassName="max-w-sm"
      />
      <SubmitCancel label="Plan the round" busy={create.isPending} busyLabel="Planning…" onCancel={onCancel} size="sm" />
    </SchemaForm>
  );
}
