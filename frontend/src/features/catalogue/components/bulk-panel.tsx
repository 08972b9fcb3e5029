import { useState } from 'react';
import type { z } from 'zod';
import {
  bulkExhibitionSchema, bulkMoveSchema, bulkRehouseSchema, bulkRoundSchema, bulkStatusSchema,
  type BulkAction, type BulkPreview, type PrintSelection,
} from '@toneledger/common/schemas/bulk';
import { STATUS } from '@toneledger/common/schemas/vocab';
import { SelectInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { SidePanel } from '@/components/ui/side-panel';
import { isApiError } from '@/lib/api-client';
import { useExhibitions } from '@/lib/exhibitions-api';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useEnclosures, useLocations } from '@/lib/reference-api';
import { useApplyAction, usePlannedRounds, usePreviewAction, type ActionFields } from '@/features/catalogue/api/bulk';
import { BulkPreviewView } from '@/features/catalogue/components/bulk-preview';

export const ACTION_TITLES: Record<BulkAction, string> = {
  move: 'Move to a location',
  rehouse: 'Rehouse in another enclosure',
  status: 'Change status',
  round: 'Add to an inspection round',
  exhibition: 'Add to an exhibition',
};

const DONE: Record<BulkAction, string> = {
  move: 'moved', rehouse: 'rehoused', status: 'given the new status', round: 'added to the round', exhibition: 'added to the exhibition',
};

const SCHEMAS: Record<BulkAction, z.ZodType> = {
  move: bulkMoveSchema, rehouse: bulkRehouseSchema, status: bulkStatusSchema, round: bulkRoundSchema, exhibition: bulkExhibitionSchema,
};
const DEFAULTS: Record<BulkAction, Record<string, string>> = {
  move: { toLocationId: '', reason: '' }, rehouse: { enclosureId: '', reason: '' }, status: { status: '' }, round: { roundId: '' }, exhibition: { exhibitionId: '' },
};
const STATUS_CHOICES = STATUS.options.filter((o) => o.value !== 'on_loan' && o.value !== 'deaccessioned');

function ActionFieldsOf({ action }: { action: BulkAction }) {
  const locations = useLocations({ pageSize: 1000 }, action === 'move');
  const enclosures = useEnclosures();
  const rounds = usePlannedRounds(action === 'round');
  const exhibitions = useExhibitions({ page: 1, pageSize: 200 }, action === 'exhibition');
  switch (action) {
    case 'move':
      return (
        <>
          <SelectInput name="toLocationId" label="To" empty="Choose a place" options={locations.data?.data.map((l) => ({ value: l.id, label: l.pathLabel }))} />
          <TextInput name="reason" label="Why they move" />
        </>
      );
    case 'rehouse':
      return (
        <>
          <SelectInput
            name="enclosureId"
            label="Into"
            empty="Choose an enclosure type"
            options={enclosures.data?.data.map((e) => ({ value: e.id, label: `${e.name}${e.alkalineBuffered === true ? ' (buffered)' : e.alkalineBuffered === false ? ' (unbuffered)' : ''}` }))}
          />
          <TextInput name="reason" label="Why (optional)" />
        </>
      );
    case 'status':
      return <SelectInput name="status" label="New status" empty="Choose a status" options={STATUS_CHOICES} hint="On loan follows a loan, and a deaccession is its own record." />;
    case 'round':
      return <SelectInput name="roundId" label="Round" empty="Choose a planned round" options={rounds.data?.map((r) => ({ value: r.id, label: `${r.title} (${r.plannedOn})` }))} />;
    case 'exhibition':
      return <SelectInput name="exhibitionId" label="Exhibition" empty="Choose an exhibition" options={exhibitions.data?.data.map((e) => ({ value: e.id, label: e.title }))} />;
  }
}

export interface BulkPanelProps {
  action: BulkAction;
  selection: PrintSelection;
  /** How the selection reads: "12 selected prints", "all 4,210 prints matching this search". */
  selectionLabel: string;
  onClose: () => void;
  onDone: () => void;
  /** A warning's offer: rehouse these prints (the rehouse action opens with them selected). */
  onRehouse: (printIds: string[]) => void;
}

/** One bulk action: its fields, then the preview of every change and its warnings, then the apply. */
export function BulkPanel({ action, selection, selectionLabel, onClose, onDone, onRehouse }: BulkPanelProps) {
  const [fields, setFields] = useState<ActionFields | null>(null);
  const [preview, setPreview] = useState<BulkPreview | null>(null);
  const [stale, setStale] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const ask = usePreviewAction(action);
  const apply = useApplyAction(action);
  const form = useSchemaForm({ schema: SCHEMAS[action], defaultValues: DEFAULTS[action] });

  function run(body: ActionFields) {
    setFields(body);
    setStale(false);
    setDone(null);
    ask.mutate({ selection, fields: body }, { onSuccess: setPreview, onError: form.serverError });
  }

  function confirm() {
    if (!fields || !preview) return;
    apply.mutate(
      { selection, fields, fingerprint: preview.fingerprint },
      {
        onSuccess: (result) => {
          setDone(`${result.changed.toLocaleString('en-GB')} ${result.changed === 1 ? 'print' : 'prints'} ${DONE[action]}${result.refused ? `; ${result.refused} refused` : ''}.`);
          setPreview(null);
          onDone();
        },
        onError: (error) => {
          // The selection changed since the preview: show the new one, to be looked at and applied again.
          const next = isApiError(error) && error.code === 'conflict' ? (error.details as { preview?: BulkPreview } | undefined)?.preview : undefined;
          if (next) {
            setPreview(next);
            setStale(true);
          }
        },
      },
    );
  }

  return (
    <SidePanel title={ACTION_TITLES[action]} description={`For ${selectionLabel}.`} onClose={onClose}>
      <div className="flex flex-col gap-4">
        <SchemaForm form={form} onValid={(body) => run(body as ActionFields)} aria-label={ACTION_TITLES[action]} className="gap-3" failureTitle="No preview.">
          <ActionFieldsOf action={action} />
          <div>
            <Button type="submit" variant={preview ? 'secondary' : 'primary'} disabled={ask.isPending}>
              {ask.isPending ? 'Working out the changes…' : 'Preview the changes'}
            </Button>
          </div>
        </SchemaForm>
        {done ? (
          <Notice tone="success" role="status">
            <p>{done}</p>
          </Notice>
        ) : null}
        {stale ? (
          <Notice tone="warning" role="alert" title="The selection changed since the preview.">
            <p>A print was edited, added or taken out meanwhile. Nothing was changed: look at the new preview below, then apply it.</p>
          </Notice>
        ) : null}
        {apply.error && !stale ? <ErrorNotice error={apply.error} title="Nothing was changed." /> : null}
        {preview ? (
          <>
            <BulkPreviewView preview={preview} action={action} onRehouse={onRehouse} />
            <div className="flex gap-2">
              <Button variant="primary" onClick={confirm} disabled={apply.isPending || preview.changing === 0 || preview.tooMany}>
                {apply.isPending ? 'Applying…' : `Apply to ${preview.changing.toLocaleString('en-GB')} ${preview.changing === 1 ? 'print' : 'prints'}`}
              </Button>
              <Button variant="quiet" onClick={onClose}>
                Close
              </Button>
            </div>
          </>
        ) : null}
      </div>
    </SidePanel>
  );
}
