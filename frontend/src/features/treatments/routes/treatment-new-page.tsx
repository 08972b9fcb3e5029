import { Link, useNavigate, useParams } from 'react-router-dom';
import { TREATMENT_PROPOSAL_FIELDS, procedureLabelOf } from '@toneledger/common/fields/procedures';
import { treatmentInputSchema } from '@toneledger/common/schemas/treatments';
import { DateInput, TextAreaInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { usePrint } from '@/lib/prints-api';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useProposeTreatment } from '@/features/treatments/api/treatments';

const today = () => new Date().toISOString().slice(0, 10);
const label = (key: (typeof TREATMENT_PROPOSAL_FIELDS)[number]['key']) => procedureLabelOf(key);

/** A treatment proposal for one print: the condition found, the aims, the options weighed, the method chosen. */
export function TreatmentNewPage() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const print = usePrint(id);
  const propose = useProposeTreatment();
  const form = useSchemaForm({
    schema: treatmentInputSchema,
    defaultValues: { proposedOn: today(), conditionFound: '', aims: '', optionsConsidered: '', chosenMethod: '' },
  });
  useDocumentTitle(print.data ? `Propose a treatment · ${print.data.accessionNumber}` : 'Propose a treatment');
  if (print.isPending) return <Loading label="Loading…" />;
  if (print.isError) return <ErrorNotice error={print.error} title="The print could not be loaded." />;
  return (
    <section className="max-w-3xl">
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/condition/treatments">Treatments</Link> <span aria-hidden="true">›</span>{' '}
        <Link to={`/condition/prints/${id}`} className="mono">{print.data.accessionNumber}</Link>
      </nav>
      <PageHeader title="Propose a treatment" description={`${print.data.accessionNumber} · ${print.data.title}. The proposal is approved by a named person before any work is recorded.`} />
      <SchemaForm
        form={form}
        onValid={(body) => propose.mutate({ printId: id, body }, { onSuccess: (t) => navigate(`/condition/treatments/${t.id}`, { replace: true }), onError: form.serverError })}
        failureTitle="The proposal was not saved."
        className="gap-4"
      >
        <DateInput name="proposedOn" label={label('proposedOn')} />
        <TextAreaInput name="conditionFound" label={label('conditionFound')} rows={3} />
        <TextAreaInput name="aims" label={label('aims')} rows={3} />
        <TextAreaInput name="optionsConsidered" label={label('optionsConsidered')} rows={3} hint="The approaches weighed, with their risks." />
        <TextAreaInput name="chosenMethod" label={label('chosenMethod')} rows={3} />
        <div className="flex gap-2">
          <Button type="submit" variant="primary" disabled={propose.isPending}>Save the proposal</Button>
          <Button onClick={() => navigate(`/condition/prints/${id}`)}>Cancel</Button>
        </div>
      </SchemaForm>
    </section>
  );
}
