import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { formatDateTime } from '@/lib/format';
import type { FieldErrors, StaleEdit } from '@/features/reference/components/use-record-form';

export interface FormMessagesProps {
  errors: FieldErrors;
  formError: string | null;
  stale: StaleEdit<{ id: string; version: number }> | null;
  notice: string | null;
  /** A person's name for a field path, e.g. `ingredients.1.amount` → "Ingredient 2: amount". */
  labelFor: (path: string) => string;
  /** A field's value as a short text, for the stale-edit comparison. */
  describe?: (field: string, value: unknown) => string;
  onReapply: () => void;
  onDiscard: () => void;
}

export function describeValue(value: unknown): string {
  if (value === null || value === undefined || value === '') return '(empty)';
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  return JSON.stringify(value);
}

/** Everything a record form has to say after a save attempt: problems, conflicts, or a note. */
export function FormMessages({ errors, formError, stale, notice, labelFor, describe, onReapply, onDiscard }: FormMessagesProps) {
  const problems = Object.entries(errors);
  const show = (field: string, value: unknown) => (describe ? describe(field, value) : describeValue(value));
  return (
    <div className="flex flex-col gap-3 empty:hidden">
      {problems.length > 0 ? (
        <Notice tone="error" role="alert" title="Not saved. Check these fields:">
          <ul className="mt-1 list-disc pl-5">
            {problems.map(([path, message]) => (
              <li key={path}>
                {path ? `${labelFor(path)}: ` : ''}
                {message}
              </li>
            ))}
          </ul>
        </Notice>
      ) : null}
      {formError ? (
        <Notice tone="error" role="alert" title="Not saved.">
          <p>{formError}</p>
        </Notice>
      ) : null}
      {stale ? (
        <div role="alert" className="rounded border border-sepia-200 bg-sepia-50 px-3 py-2 text-sm text-sepia-800">
          <p className="font-semibold">
            Not saved: {stale.lastChangedBy ?? 'someone else'} saved this record
            {stale.lastChangedAt ? (
              <>
                {' '}
                at <time dateTime={stale.lastChangedAt}>{formatDateTime(stale.lastChangedAt)}</time>
              </>
            ) : null}{' '}
            after you opened it.
          </p>
          <table className="mt-2 w-full border-collapse text-left text-xs">
            <caption className="sr-only">Fields changed since you opened the record</caption>
            <thead>
              <tr>
                <th scope="col" className="py-1 pr-2 font-semibold">Field</th>
                <th scope="col" className="py-1 pr-2 font-semibold">When you opened it</th>
                <th scope="col" className="py-1 pr-2 font-semibold">Saved since</th>
                <th scope="col" className="py-1 font-semibold">Yours</th>
              </tr>
            </thead>
            <tbody>
              {stale.rows.map((row) => (
                <tr key={row.field} className="border-t border-sepia-200 align-top">
                  <th scope="row" className="py-1 pr-2 font-medium">
                    {labelFor(row.field)}
                    {row.theyChanged && row.youChanged ? <span className="block font-normal">(both changed)</span> : null}
                  </th>
                  <td className="py-1 pr-2 break-words">{show(row.field, row.was)}</td>
                  <td className="py-1 pr-2 break-words">{row.theyChanged ? show(row.field, row.theirs) : 'unchanged'}</td>
                  <td className="py-1 break-words">{row.youChanged ? show(row.field, row.yours) : 'unchanged'}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-2">
            Re-applying puts your changes on top of the saved version (yours win where both changed); nothing is saved until
            you save again.
          </p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button size="sm" variant="primary" onClick={onReapply}>
              Re-apply my changes
            </Button>
            <Button size="sm" onClick={onDiscard}>
              Discard my changes
            </Button>
          </div>
        </div>
      ) : null}
      {notice ? (
        <p role="status" className="text-sm text-ink-700">
          {notice}
        </p>
      ) : null}
    </div>
  );
}

export function FormActions({ saving, onCancel }: { saving: boolean; onCancel?: () => void }) {
  return (
    <div className="flex flex-wrap gap-2 pt-1">
      <Button type="submit" variant="primary" disabled={saving}>
        Save
      </Button>
      {onCancel ? (
        <Button onClick={onCancel} disabled={saving}>
          Cancel
        </Button>
      ) : null}
      {saving ? (
        <span role="status" className="self-center text-sm text-ink-700">
          Saving…
        </span>
      ) : null}
    </div>
  );
}
