import { VoidCaptureDate } from '@/features/condition/components/void-capture-date';
import { useId, useState, type ReactNode } from 'react';
import { can, type Role } from '@toneledger/common/domain/roles';
import { VIEW_TYPES, VIEW_TYPE_LABELS, imageDeleteSchema, imageUpdateSchema, type PrintImage } from '@toneledger/common/schemas/images';
import { DateInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { formatDateTime } from '@/lib/format';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useFixityHistory } from '@/features/condition/api/fixity';
import { useCheckFixity, useUpdateImage, useWithdrawImage } from '@/features/condition/api/save-image';
import { FixityBadge } from '@/features/condition/components/fixity-badge';
import { formatBytes, formatDay, formatExposure } from '@/features/condition/utils/format';

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[8rem_1fr] gap-2 border-b border-paper-200 py-1 last:border-b-0">
      <dt className="text-xs font-semibold tracking-wide text-ink-700 uppercase">{term}</dt>
      <dd className="text-sm [overflow-wrap:anywhere]">{children}</dd>
    </div>
  );
}

function exifLine(image: PrintImage): string | null {
  const e = image.exif;
  const parts = [formatExposure(e.exposureTime), e.fNumber ? `f/${e.fNumber}` : null, e.iso ? `ISO ${e.iso}` : null, e.focalLength ? `${e.focalLength} mm` : null].filter(Boolean);
  return parts.length ? parts.join(' · ') : null;
}

interface ImageValues {
  viewType: string;
  capturedOn: string;
  notes: string;
}

function EditImageForm({ image, onDone }: { image: PrintImage; onDone: () => void }) {
  const update = useUpdateImage();
  const form = useSchemaForm({
    schema: imageUpdateSchema,
    defaultValues: { viewType: image.viewType, capturedOn: image.capturedOn ?? '', notes: image.notes ?? '' } satisfies ImageValues,
    // The body: no capture date and no notes are null, on the version shown.
    toBody: (values: ImageValues) => ({
      viewType: values.viewType,
      capturedOn: values.capturedOn || null,
      notes: values.notes.trim() || null,
      version: image.version,
    }),
  });

  return (
    <SchemaForm
      form={form}
      onValid={(body) => update.mutate({ id: image.id, update: body }, { onSuccess: onDone, onError: form.serverError })}
      aria-label="Edit image details"
      className="mt-3 gap-3 rounded border border-paper-300 bg-paper-50 p-3"
    >
      <SelectInput name="viewType" label="View shown" options={VIEW_TYPES.map((v) => ({ value: v, label: VIEW_TYPE_LABELS[v] }))} />
      <DateInput name="capturedOn" label="Captured on" />
      <TextAreaInput name="notes" label="Image notes" rows={2} />
      <SubmitCancel label="Save image details" busy={update.isPending} onCancel={onDone} size="sm" />
    </SchemaForm>
  );
}

function WithdrawForm({ image, onDone, onWithdrawn }: { image: PrintImage; onDone: () => void; onWithdrawn?: (image: PrintImage) => void }) {
  const withdraw = useWithdrawImage();
  const form = useSchemaForm({ schema: imageDeleteSchema, defaultValues: { reason: '' }, toBody: (values: { reason: string }) => ({ ...values, version: image.version }) });

  return (
    <SchemaForm
      form={form}
      onValid={(body) =>
        withdraw.mutate({ id: image.id, withdrawal: body }, { onSuccess: (saved) => (onWithdrawn ? onWithdrawn(saved) : onDone()), onError: form.serverError })
      }
      failureTitle="Not withdrawn."
      aria-label="Withdraw image"
      className="mt-3 gap-3 rounded border border-danger-200 bg-danger-50 p-3 text-sm"
    >
      <p>
        A withdrawn image is no longer shown or offered for comparison. Its files are kept for the retention period and then purged; the record of
        the upload and of the withdrawal stays in the audit trail.
      </p>
      <TextInput name="reason" label="Reason for withdrawal" />
      <SubmitCancel label="Withdraw image" busy={withdraw.isPending} onCancel={onDone} variant="danger" size="sm" />
    </SchemaForm>
  );
}

function FixityHistory({ image }: { image: PrintImage }) {
  const history = useFixityHistory(image.id, true);
  if (history.isPending) return <p className="text-xs text-ink-700">Loading fixity checks…</p>;
  if (history.isError) return <ErrorNotice error={history.error} title="The fixity checks could not be loaded." />;
  if (history.data.length === 0) return <p className="text-xs text-ink-700">No fixity checks yet.</p>;
  return (
    <ol className="mt-1 flex flex-col gap-1 text-xs">
      {history.data.map((r) => (
        <li key={r.id}>
          <time dateTime={r.checkedAt}>{formatDateTime(r.checkedAt)}</time> · <FixityBadge result={r} />
          {r.detail ? <span className="text-ink-700"> {r.detail}</span> : null}
        </li>
      ))}
    </ol>
  );
}

/** One image's record: file, capture, EXIF summary, fixity, and (for those who may) edit and withdraw. */
export function ImageDetails({ image, role, onWithdrawn }: { image: PrintImage; role: Role; onWithdrawn?: (image: PrintImage) => void }) {
  const headingId = useId();
  const [mode, setMode] = useState<'view' | 'edit' | 'withdraw'>('view');
  const [showChecks, setShowChecks] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const check = useCheckFixity();
  const mayWrite = can(role, 'images.write');
  const staff = can(role, 'catalogue.read_restricted');
  const camera = [image.exif.make, image.exif.model].filter(Boolean).join(' ');
  const exposure = exifLine(image);

  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-3">
      <h3 id={headingId} className="text-base">
        {VIEW_TYPE_LABELS[image.viewType]} · {image.capturedOn ? formatDay(image.capturedOn) : 'capture date not recorded'}
      </h3>
      {image.withdrawn ? (
        <Notice tone="warning">
          <p>
            Withdrawn on {formatDateTime(image.withdrawn.at)}
            {image.withdrawn.by ? ` by ${image.withdrawn.by}` : ''}: {image.withdrawn.reason}. The files are kept until{' '}
            {formatDateTime(image.withdrawn.purgeAfter)}, then purged.
          </p>
        </Notice>
      ) : null}
      {message ? (
        <Notice tone="success" role="status">
          <p>{message}</p>
        </Notice>
      ) : null}
      <dl className="mt-2">
        <Row term="File">
          {image.fileName} · {image.width} × {image.height} px · {formatBytes(image.sizeBytes)}
        </Row>
        <Row term="Uploaded">
          {formatDateTime(image.uploadedAt)}
          {image.uploadedBy ? ` by ${image.uploadedBy}` : ''}
        </Row>
        <Row term="Camera">{camera || 'Not in the file'}</Row>
        {image.exif.lens ? <Row term="Lens">{image.exif.lens}</Row> : null}
        <Row term="Exposure">{exposure ?? 'Not in the file'}</Row>
        {image.exif.capturedAt ? <Row term="Taken (EXIF)">{image.exif.capturedAt}</Row> : null}
        {image.voidedCaptureDates?.length || (image.capturedOn && can(role, 'measurements.write')) ? (
          <Row term="Capture date">
            <VoidCaptureDate image={image} role={role} />
          </Row>
        ) : null}
        {image.notes ? <Row term="Notes">{image.notes}</Row> : null}
        <Row term="SHA-256">
          <code className="mono text-xs select-all">{image.sha256}</code>
        </Row>
        <Row term="Fixity">
          <FixityBadge result={image.lastFixity} />
          {image.lastFixity ? <span className="ml-1 text-xs text-ink-700">checked {formatDateTime(image.lastFixity.checkedAt)}</span> : null}
          {showChecks ? <FixityHistory image={image} /> : null}
        </Row>
      </dl>
      <div className="mt-2 flex flex-wrap gap-2">
        {image.urls.original ? (
          <a href={image.urls.original} download className="text-sm">
            Download the original
          </a>
        ) : null}
        {staff ? (
          <Button size="sm" variant="quiet" onClick={() => setShowChecks((s) => !s)} aria-expanded={showChecks}>
            {showChecks ? 'Hide fixity checks' : 'Show fixity checks'}
          </Button>
        ) : null}
        {can(role, 'fixity.manage') && !image.withdrawn ? (
          <Button
            size="sm"
            disabled={check.isPending}
            onClick={() =>
              check.mutate(
                { id: image.id, printId: image.printId },
                { onSuccess: (r) => setMessage(r.ok ? 'Fixity checked: the file matches its SHA-256.' : `Fixity checked: ${r.outcome}.`) },
              )
            }
          >
            Check fixity now
          </Button>
        ) : null}
        {mayWrite && !image.withdrawn && mode === 'view' ? (
          <>
            <Button size="sm" onClick={() => setMode('edit')}>
              Edit details
            </Button>
            <Button size="sm" variant="quiet" onClick={() => setMode('withdraw')}>
              Withdraw…
            </Button>
          </>
        ) : null}
      </div>
      {check.isError ? <ErrorNotice error={check.error} title="The check did not run." /> : null}
      {mode === 'edit' ? <EditImageForm image={image} onDone={() => setMode('view')} /> : null}
      {mode === 'withdraw' ? (
        <WithdrawForm image={image} onDone={() => setMode('view')} onWithdrawn={onWithdrawn} />
      ) : null}
    </section>
  );
}
