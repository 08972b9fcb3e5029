import { useId, useState, type FormEvent } from 'react';
import { movementInputSchema, type Print } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { isApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { useLocations } from '@/lib/reference-api';
import { useMovements } from '@/features/catalogue/api/get-movements';
import { useMovePrint } from '@/features/catalogue/api/move-print';
import { serverIssuesToErrors, type FieldErrors } from '@/features/catalogue/utils/print-form';

function MoveForm({ print }: { print: Print }) {
  const locations = useLocations();
  const move = useMovePrint();
  const [toLocationId, setTo] = useState('');
  const [reason, setReason] = useState('');
  const [movedAt, setMovedAt] = useState('');
  const [errors, setErrors] = useState<FieldErrors>({});
  const [done, setDone] = useState<string | null>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    setDone(null);
    const when = movedAt ? new Date(movedAt) : null;
    const candidate = {
      toLocationId,
      reason,
      ...(when && !Number.isNaN(when.getTime()) ? { movedAt: when.toISOString() } : {}),
      version: print.version,
    };
    const checked = movementInputSchema.safeParse(candidate);
    if (!checked.success) {
      const next: FieldErrors = {};
      for (const issue of checked.error.issues) next[String(issue.path[0] ?? 'form')] ??= issue.message;
      if (next.toLocationId) next.toLocationId = 'Choose where the print goes';
      setErrors(next);
      return;
    }
    if (movedAt && !candidate.movedAt) {
      setErrors({ movedAt: 'Enter a date and time' });
      return;
    }
    setErrors({});
    move.mutate(
      { printId: print.id, input: checked.data },
      {
        onSuccess: (saved) => {
          setDone(`Moved to ${saved.location?.pathLabel ?? 'the new place'}.`);
          setTo('');
          setReason('');
          setMovedAt('');
        },
        onError: (error) => {
          if (isApiError(error)) setErrors(serverIssuesToErrors(error.details));
        },
      },
    );
  }

  const conflict = isApiError(move.error) && move.error.code === 'conflict';
  return (
    <form onSubmit={submit} aria-label="Move this print" className="mt-4 flex flex-col gap-3 rounded border border-paper-300 bg-paper-50 p-3" noValidate>
      <h3 className="font-sans text-sm font-semibold text-ink-900">Move this print</h3>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="To location" value={toLocationId} onChange={(e) => setTo(e.target.value)} error={errors.toLocationId}>
          <option value="">Choose a place…</option>
          {locations.data?.data
            .filter((l) => l.id !== print.location?.id)
            .map((l) => (
              <option key={l.id} value={l.id}>
                {l.pathLabel}
              </option>
            ))}
        </SelectField>
        <TextField
          label="Moved at (optional)"
          type="datetime-local"
          value={movedAt}
          onChange={(e) => setMovedAt(e.target.value)}
          error={errors.movedAt}
          hint="Leave empty for now"
        />
      </div>
      <TextField label="Reason" value={reason} onChange={(e) => setReason(e.target.value)} error={errors.reason} maxLength={500} />
      {move.isError ? (
        conflict ? (
          <Notice tone="warning" role="alert" title="This print was changed while the page was open.">
            <p>The page now shows the current record. Check its location, then press Move again.</p>
          </Notice>
        ) : (
          <ErrorNotice error={move.error} title="The print was not moved." />
        )
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
    </form>
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
      {mayMove ? <MoveForm print={print} /> : null}
    </section>
  );
}
