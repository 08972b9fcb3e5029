import { bagExportStartSchema } from '@toneledger/common/schemas/preservation';
import { CheckboxInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useStartBagExport } from '@/lib/preservation-api';

interface Values { withImages: boolean }

/** Starts a bag of the whole collection. */
export function ExportForm() {
  const start = useStartBagExport();
  const form = useSchemaForm({
    schema: bagExportStartSchema,
    defaultValues: { withImages: true } as Values,
    toBody: (v: Values) => ({ scope: 'collection' as const, withImages: v.withImages }),
  });
  return (
    <SchemaForm
      form={form}
      onValid={(body) => start.mutate(body, { onError: form.serverError })}
      failureTitle="The export did not start."
      aria-labelledby="export-heading"
      className="gap-3 rounded border border-paper-300 bg-paper-100 p-4"
    >
      <h2 id="export-heading" className="text-lg">Export the collection</h2>
      <p className="text-sm text-ink-700">
        Writes every record, the CSVs, the audit trail and a data dictionary into one BagIt bag (a .tar file any archive can check),
        in the background. It reads the collection as it is when the export starts.
      </p>
      <CheckboxInput name="withImages" label="Include the image files (originals byte for byte, and their display copies)" />
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={start.isPending}>Start the export</Button>
        <span aria-live="polite" className="text-sm text-ink-700">{start.isSuccess ? 'Started: follow it in the list below.' : ''}</span>
      </div>
    </SchemaForm>
  );
}
