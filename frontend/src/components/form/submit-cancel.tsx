import { Button } from '@/components/ui/button';

export interface SubmitCancelProps {
  /** The submit button's name, e.g. "Save session". */
  label: string;
  /** The request is running: the submit button is disabled (and says `busyLabel`, when given). */
  busy: boolean;
  busyLabel?: string;
  onCancel: () => void;
  /** The submit button is disabled for another reason too. */
  disabled?: boolean;
  variant?: 'primary' | 'danger';
  size?: 'sm' | 'md';
}

/** The submit button of a small form, and Cancel beside it. */
export function SubmitCancel({ label, busy, busyLabel, onCancel, disabled = false, variant = 'primary', size = 'md' }: SubmitCancelProps) {
  return (
    <div className="flex gap-2">
      <Button type="submit" variant={variant} size={size} disabled={busy || disabled}>
        {busy && busyLabel ? busyLabel : label}
      </Button>
      <Button size={size} onClick={onCancel}>
        Cancel
      </Button>
    </div>
  );
}
