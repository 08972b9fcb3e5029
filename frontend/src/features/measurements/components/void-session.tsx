import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { voidsApi } from '@toneledger/common/api/procedures';
import { can } from '@toneledger/common/domain/roles';
import type { MeasurementSession } from '@toneledger/common/schemas/measurements';
import { TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { callData } from '@/lib/api-client';
import { useMe } from '@/lib/auth';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { measurementKeys } from '@/features/measurements/api/keys';

const voidSchema = z.object({ reason: z.string().trim().min(3, 'Say why (at least 3 characters)').max(500, 'At most 500 characters') });

/** A session voided (struck through, with why), or for a conservator the form that voids it with a reason. */
export function VoidSession({ session }: { session: MeasurementSession }) {
  const me = useMe();
  const qc = useQueryClient();
  const act = useMutation({
    mutationFn: (reason: string) => callData(voidsApi.session, { params: { id: session.id }, body: { reason } }),
    onSuccess: async () => {
      await Promise.all([qc.invalidateQueries({ queryKey: measurementKeys.detail(session.printId) }), qc.invalidateQueries({ queryKey: measurementKeys.lists() })]);
    },
  });
  const form = useSchemaForm({ schema: voidSchema, defaultValues: { reason: '' } });
  if (session.voided) {
    return <p className="text-sm">Voided {session.voided.at.slice(0, 10)} by {session.voided.by}: {session.voided.reason}. Left out of rates and projections.</p>;
  }
  if (!can(me.role, 'measurements.write')) return null;
  return (
    <details className="text-sm">
      <summary>Void this session</summary>
      <SchemaForm form={form} onValid={(b) => act.mutate(b.reason, { onError: form.serverError })} failureTitle="Not voided." className="mt-2 gap-2">
        <TextInput name="reason" label="Why it is void" hint="The session is kept and shown struck through; every analysis leaves it out." />
        <div><Button type="submit" disabled={act.isPending}>Void the session</Button></div>
      </SchemaForm>
    </details>
  );
}
