import { useId, useState, type FormEvent } from 'react';
import { baselineChoiceSchema, type MeasurementSession, type Spot } from '@toneledger/common/schemas/measurements';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { ErrorNotice } from '@/components/ui/notice';
import { TextAreaField } from '@/components/ui/text-area-field';
import { isApiError } from '@/lib/api-client';
import { useChooseBaseline } from '@/features/measurements/api/save-spot';
import { formatDay } from '@/features/measurements/utils/format';

const AUTOMATIC = '';

export interface BaselineControlProps {
  spot: Spot;
  /** Sessions with readings at this spot, to choose from. */
  sessions: MeasurementSession[];
}

/**
 * Lets a conservator name the session every later reading at this spot is compared with, and
 * say why. The reason is required (the server refuses a choice without one, and so does this form).
 */
export function BaselineControl({ spot, sessions }: BaselineControlProps) {
  const [open, setOpen] = useState(false);
  const [sessionId, setSessionId] = useState(spot.baseline?.sessionId ?? AUTOMATIC);
  const [reason, setReason] = useState('');
  const [errors, setErrors] = useState<{ sessionId?: string; reason?: string }>({});
  const [saved, setSaved] = useState(false);
  const choose = useChooseBaseline();
  const headingId = useId();

  function submit(event: FormEvent) {
    event.preventDefault();
    choose.reset();
    setSaved(false);
    const checked = baselineChoiceSchema.safeParse({ sessionId: sessionId === AUTOMATIC ? null : sessionId, reason, version: spot.version });
    if (!checked.success) {
      const found: typeof errors = {};
      for (const issue of checked.error.issues) {
        const key = issue.path[0] === 'sessionId' ? 'sessionId' : 'reason';
        found[key] ??= issue.message;
      }
      setErrors(found);
      return;
    }
    setErrors({});
    choose.mutate(
      { id: spot.id, choice: checked.data },
      {
        onSuccess: () => {
          setOpen(false);
          setReason('');
          setSaved(true);
        },
        onError: (error) => {
          if (!isApiError(error)) return;
          const found: typeof errors = {};
          for (const issue of error.fieldIssues) found[issue.path === 'sessionId' ? 'sessionId' : 'reason'] ??= issue.message;
          setErrors(found);
        },
      },
    );
  }

  if (!open) {
    return (
      <div className="flex flex-wrap items-center gap-3 print:hidden">
        <Button size="sm" onClick={() => setOpen(true)}>
          Choose baseline
        </Button>
        {saved ? (
          <p role="status" className="text-sm text-ok-700">
            Baseline saved; the figures are being worked out again.
          </p>
        ) : null}
      </div>
    );
  }

  const otherError = choose.isError && !(isApiError(choose.error) && choose.error.fieldIssues.length > 0);
  return (
    <form onSubmit={submit} noValidate aria-labelledby={headingId} className="mt-2 flex max-w-xl flex-col gap-3 rounded border border-paper-300 bg-paper-50 p-3 print:hidden">
      <h3 id={headingId} className="font-sans text-sm font-semibold">
        Choose the baseline for {spot.name}
      </h3>
      <SelectField label="Baseline session" value={sessionId} onChange={(e) => setSessionId(e.target.value)} error={errors.sessionId}>
        <option value={AUTOMATIC}>The first comparable session (automatic)</option>
        {sessions.map((s) => (
          <option key={s.id} value={s.id}>
            {formatDay(s.measuredOn)} · {s.instrument} · {s.illuminant}/{s.observer}° · {s.geometry}
          </option>
        ))}
      </SelectField>
      <TextAreaField
        label="Reason"
        hint="Why this session is the one to compare with: for example, the first reading after treatment."
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        error={errors.reason}
        maxLength={500}
        required
      />
      {otherError ? <ErrorNotice error={choose.error} title="The baseline was not changed." /> : null}
      <div className="flex gap-2">
        <Button type="submit" variant="primary" disabled={choose.isPending}>
          {choose.isPending ? 'Saving…' : 'Save baseline'}
        </Button>
        <Button
          onClick={() => {
            setOpen(false);
            setErrors({});
            choose.reset();
          }}
        >
          Cancel
        </Button>
      </div>
    </form>
  );
}
