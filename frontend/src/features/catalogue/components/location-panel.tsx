import { useId, useState } from 'react';
import type { z } from 'zod';
import { movementInputSchema, type Print } from '@toneledger/common/schemas/catalogue';
import { SelectInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { exportsApi } from '@toneledger/common/api/exports';
import { Button } from '@/components/ui/button';
import { ExportLinks } from '@/components/ui/export-links';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { isApiError, urlOf } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { fieldIssuesOf, type FieldErrors } from '@/lib/forms/field-errors';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useLocations } from '@/lib/reference-api';
import { useMovements } from '@/features/catalogue/api/get-movements';
import { useMovePrint } from '@/features/catalogue/api/move-print';

interface MoveValues {
  toLocationId: string;
  reason: string;
  /** As the date-and-time control gives it, in local time; empty for now. */
  movedAt: string;
}

const EMPTY_MOVE: MoveValues = { toLocationId: '', reason: '', movedAt: '' };

function MoveForm({ print }: { print: Print }) {
  const locations = useLocations();
  const move = useMovePrint();
  const [done, setDone] = useState<string | null>(null);
  const form = useSchemaForm({
    schema: movementInputSchema,
    defaultValues: EMPTY_MOVE,
    // The body: the local date and time as an instant (left as typed when it is not one, so the schema says so), on the print's version.
    toBody: (values: MoveValues) => {
      const when = values.movedAt ? new Date(values.movedAt) : null;
      const movedAt = when === null ? undefined : Number.isNaN(when.getTime()) ? values.movedAt : when.toISOString();
      return { toLocationId: values.toLocationId, reason: values.reason, movedAt, version: print.version };
    },
    check: (values: MoveValues): FieldErrors => (values.toLocationId ? {} : { toLocationId: 'Choose where the print goes' }),
  });

  function onValid(body: z.output<typeof movementInputSchema>) {
    setDone(null);
    move.mutate(
      { printId: print.id, input: body },
      {
        onSuccess: (saved) => {
          setDone(`Moved to ${saved.location?.pathLabel ?? 'the new place'}.`);
          form.reset(EMPTY_MOVE);
        },
        onError: (error) => {
          // A stale version is said below; the page has the current record by then.
          if (!(isApiError(error) && error.code === 'conflict' && fieldIssuesOf(error).length === 0)) form.serverError(error);
        },
      },
    );
  }

  const conflict = isApiError(move.error) && move.error.code === 'conflict' && fieldIssuesOf(move.error).length === 0;
  return (
    <SchemaForm form={form} onValid={onValid} failureTitle="The print was not moved." aria-label="Move this print" className="mt-4 gap-3 rounded border border-paper-300 bg-paper-50 p-3">
      <h3 className="font-sans text-sm font-semibold text-ink-900">Move this print</h3>
      <div className="grid gap-3">
        <SelectInput
          name="toLocationId"
          label="To location"
          empty="Choose a place…"
          options={locations.data?.data.filter((l) => l.id !== print.location?.id).map((l) => ({ value: l.id, label: l.pathLabel }))}
        />
        <TextInput name="movedAt" label="Moved at (optional)" type="datetime-local" hint="Leave empty for now" />
      </div>
      <TextInput name="reason" label="Reason" />
      {conflict ? (
        <Notice tone="warning" role="alert" title="This print was changed while the page was open.">
          <p>The page now shows the current record. Check its location, then press Move again.</p>
        </Notice>
      ) : null}
      {done ? (
        <p role="status" className="text-sm text-ok-700">
          {done}
        </p>
      ) : null}
      <div>
        <Button type="submit" variant="primary" disabled={move.isPending}>
          {move.isPending ? 'Moving…' : 'Move'}
        </Button>
      </div>
    </SchemaForm>
  );
}

/** Where the print is now, where it has been, and (for those who may) a form to move it. */
export function LocationPanel({ print, mayMove }: { print: Print; mayMove: boolean }) {
  const movements = useMovements(print.id, true);
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={headingId} className="text-lg">
        Location
      </h2>
      <p className="mt-1 text-sm">
        <span className="text-ink-600">Now: </span>
        {print.location ? <strong className="font-semibold">{print.location.pathLabel}</strong> : <span className="text-ink-700">No location recorded.</span>}
      </p>
      <h3 className="mt-3 font-sans text-xs font-semibold tracking-wider text-ink-700 uppercase">Movements</h3>
      {movements.isPending ? <Loading label="Loading movements…" /> : null}
      {movements.isError ? <ErrorNotice error={movements.error} title="The movements could not be loaded." /> : null}
      {movements.data ? (
        movements.data.length === 0 ? (
          <p className="mt-1 text-sm text-ink-700">No movements recorded.</p>
        ) : (
          <ol className="mt-1 flex flex-col divide-y divide-paper-200 text-sm">
            {movements.data.map((m) => (
              <li key={m.id} className="py-1.5">
                <p>
                  <time dateTime={m.movedAt} className="text-ink-700">
                    {formatDateTime(m.movedAt)}
                  </time>
                  {' · '}
                  {m.from ? `${m.from.pathLabel} → ` : 'Placed in '}
                  <strong className="font-semibold">{m.to.pathLabel}</strong>
                </p>
                <p className="text-ink-700">
                  {m.reason}
                  {m.movedBy ? ` — ${m.movedBy}` : ''}
                </p>
              </li>
            ))}
          </ol>
        )
      ) : null}
      {movements.data && movements.data.length > 0 ? (
        <div className="mt-2 print:hidden">
          <ExportLinks
            what="this print's movements"
            csv={urlOf(exportsApi.movementsCsv, { params: { id: print.id } })}
            json={urlOf(exportsApi.movementsJson, { params: { id: print.id } })}
            dictionary={urlOf(exportsApi.dictionaryCsv, { params: { name: 'movements' } })}
          />
        </div>
      ) : null}
      {mayMove ? <MoveForm print={print} /> : null}
    </section>
  );
}
