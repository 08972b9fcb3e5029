import { Button } from '@/components/ui/button';

/** Save and Cancel under a reference form, with "Saving…" while the request runs. */
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
