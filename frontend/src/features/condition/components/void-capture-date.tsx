import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { voidsApi } from '@toneledger/common/api/procedures';
import { can, type Role } from '@toneledger/common/domain/roles';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { callData } from '@/lib/api-client';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { imageKeys } from '@/lib/images-api';
import { printKeys } from '@/lib/prints-api';

const voidSchema = z.object({ reason: z.string().trim().min(3, 'Say why (at least 3 characters)').max(500, 'At most 500 characters') });

/** The capture dates voided as mistaken (struck through, with why), and for a conservator the form that voids the current one. */
export function VoidCaptureDate({ image, role }: { image: PrintImage; role: Role }) {
  const qc = useQueryClient();
  const act = useMutation({
    mutationFn: (reason: string) => callData(voidsApi.captureDate, { params: { id: image.id }, body: { reason, version: image.version } }),
    onSuccess: async () => {
      await Promise.all([qc.invalidateQueries({ queryKey: imageKeys.all }), qc.invalidateQueries({ queryKey: printKeys.timeline(image.printId) })]);
    },
  });
  const form = useSchemaForm({ schema: voidSchema, defaultValues: { reason: '' } });
  const voids = image.voidedCaptureDates ?? [];
  return (
    <div className="text-sm">
      {voids.map((v) => (
        <p key={v.at}><s>{v.capturedOn}</s> voided {v.at.slice(0, 10)} by {v.by}: {v.reason}</p>
      ))}
      {image.capturedOn && !image.withdrawn && can(role, 'measurements.write') ? (
        <details>
          <summary>Void the capture date</summary>
          <SchemaForm form={form} onValid={(b) => act.mutate(b.reason, { onError: form.serverError })} failureTitle="Not voided." className="mt-2 gap-2">
            <TextInput name="reason" label="Why the date is wrong" hint="The date is kept on record, struck through; the image is left without one." />
            <div><Button type="submit" size="sm" disabled={act.isPending}>Void the date</Button></div>
          </SchemaForm>
        </details>
      ) : null}
    </div>
  );
}
