import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { deaccessionsApi } from '@toneledger/common/api/procedures';
import { can } from '@toneledger/common/domain/roles';
import { procedureLabelOf } from '@toneledger/common/fields/procedures';
import { deaccessionApprovalSchema, deaccessionCompletionSchema, deaccessionInputSchema, deaccessionWithdrawSchema, type Deaccession } from '@toneledger/common/schemas/deaccessions';
import { DEACCESSION_METHOD, DEACCESSION_STATUS } from '@toneledger/common/schemas/procedure-vocab';
import { DateInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { callData } from '@/lib/api-client';
import { useMe } from '@/lib/auth';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { printKeys } from '@/lib/prints-api';

const today = () => new Date().toISOString().slice(0, 10);
const key = (printId: string) => ['deaccessions', printId] as const;

function useAct<A>(printId: string, fn: (a: A) => Promise<Deaccession>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async () => {
      await Promise.all([qc.invalidateQueries({ queryKey: key(printId) }), qc.invalidateQueries({ queryKey: printKeys.detail(printId) })]);
    },
  });
}

function ProposeForm({ printId, onDone }: { printId: string; onDone: () => void }) {
  const propose = useAct(printId, (body: BodyIn<typeof deaccessionsApi.propose>) => callData(deaccessionsApi.propose, { params: { id: printId }, body }));
  const form = useSchemaForm({ schema: deaccessionInputSchema, defaultValues: { proposedOn: today(), reason: '', method: 'transfer', recipient: '' } });
  return (
    <SchemaForm form={form} onValid={(body) => propose.mutate(body, { onSuccess: onDone, onError: form.serverError })} failureTitle="Not proposed." className="gap-3">
      <DateInput name="proposedOn" label={procedureLabelOf('proposedOn')} />
      <TextAreaInput name="reason" label={procedureLabelOf('reason')} rows={3} />
      <SelectInput name="method" label={procedureLabelOf('method')} options={DEACCESSION_METHOD.options} />
      <TextInput name="recipient" label={procedureLabelOf('recipient')} hint="For a transfer or a return." />
      <div><Button type="submit" variant="primary" disabled={propose.isPending}>Propose the deaccession</Button></div>
    </SchemaForm>
  );
}

function NextStep({ d }: { d: Deaccession }) {
  const approve = useAct(d.printId, (body: BodyIn<typeof deaccessionsApi.approve>) => callData(deaccessionsApi.approve, { params: { id: d.id }, body }));
  const complete = useAct(d.printId, (body: BodyIn<typeof deaccessionsApi.complete>) => callData(deaccessionsApi.complete, { params: { id: d.id }, body }));
  const withdraw = useAct(d.printId, (body: BodyIn<typeof deaccessionsApi.withdraw>) => callData(deaccessionsApi.withdraw, { params: { id: d.id }, body }));
  const approval = useSchemaForm({ schema: deaccessionApprovalSchema, defaultValues: { authority: '', approvedOn: today(), version: d.version } });
  const completion = useSchemaForm({ schema: deaccessionCompletionSchema, defaultValues: { completedOn: today(), finalNote: '', version: d.version } });
  const withdrawal = useSchemaForm({ schema: deaccessionWithdrawSchema, defaultValues: { why: '', version: d.version } });
  return (
    <div className="mt-3 flex flex-col gap-4">
      {d.status === 'proposed' ? (
        <SchemaForm form={approval} onValid={(b) => approve.mutate({ ...b, version: d.version }, { onError: approval.serverError })} failureTitle="Not approved." className="gap-3">
          <TextInput name="authority" label={procedureLabelOf('authority')} />
          <DateInput name="approvedOn" label={procedureLabelOf('approvedOn')} />
          <div><Button type="submit" variant="primary">Record the approval</Button></div>
        </SchemaForm>
      ) : (
        <SchemaForm form={completion} onValid={(b) => complete.mutate({ ...b, version: d.version }, { onError: completion.serverError })} failureTitle="Not completed." className="gap-3">
          <Notice tone="warning"><p>Completing makes the print&rsquo;s record read-only for good: it stays findable and readable, and nothing of it can be changed.</p></Notice>
          <DateInput name="completedOn" label={procedureLabelOf('completedOn')} />
          <TextAreaInput name="finalNote" label={procedureLabelOf('finalNote')} rows={3} />
          <div><Button type="submit" variant="primary">Complete the deaccession</Button></div>
        </SchemaForm>
      )}
      <SchemaForm form={withdrawal} onValid={(b) => withdraw.mutate({ ...b, version: d.version }, { onError: withdrawal.serverError })} failureTitle="Not withdrawn." className="gap-3">
        <TextInput name="why" label="Why the proposal is withdrawn" />
        <div><Button type="submit">Withdraw the proposal</Button></div>
      </SchemaForm>
    </div>
  );
}

/** Deaccession on the print's page: the records (a withdrawn proposal stays), and the next step for registrars. */
export function DeaccessionPanel({ printId }: { printId: string }) {
  const me = useMe();
  const [proposing, setProposing] = useState(false);
  const readable = can(me.role, 'catalogue.read_restricted');
  const q = useQuery({ queryKey: key(printId), queryFn: () => callData(deaccessionsApi.forPrint, { params: { id: printId } }), enabled: readable });
  if (!readable || q.isPending || q.isError) return null;
  const writer = can(me.role, 'deaccessions.write');
  const open = q.data.find((d) => d.status === 'proposed' || d.status === 'approved');
  const completed = q.data.find((d) => d.status === 'completed');
  if (!q.data.length && !writer) return null;
  return (
    <section aria-label="Deaccession" className="rounded border border-paper-300 bg-white p-4">
      <h2 className="mb-2 text-lg">Deaccession</h2>
      {completed ? (
        <Notice tone="warning"><p>Deaccessioned on {completed.completedOn}; this record is read-only.</p></Notice>
      ) : null}
      <ul className="flex flex-col gap-2">
        {q.data.map((d) => (
          <li key={d.id} className="text-sm">
            <p className="font-medium">{DEACCESSION_STATUS.labels[d.status]} · {DEACCESSION_METHOD.labels[d.method]}{d.recipient ? ` to ${d.recipient}` : ''}</p>
            <p className="whitespace-pre-wrap">{d.reason}</p>
            <p className="text-ink-700">
              Proposed {d.proposedOn} by {d.proposedBy}
              {d.approvedOn ? `; approved ${d.approvedOn} by ${d.authority}` : ''}
              {d.completedOn ? `; completed ${d.completedOn} by ${d.completedBy}` : ''}
              {d.withdrawnWhy ? `; withdrawn: ${d.withdrawnWhy}` : ''}
            </p>
            {d.finalNote ? <p className="whitespace-pre-wrap">{d.finalNote}</p> : null}
          </li>
        ))}
      </ul>
      {writer && open ? <NextStep key={open.version} d={open} /> : null}
      {writer && !open && !completed ? (
        proposing ? <ProposeForm printId={printId} onDone={() => setProposing(false)} /> : <Button onClick={() => setProposing(true)}>Propose a deaccession</Button>
      ) : null}
    </section>
  );
}
