import type { PrintField, StaleChange } from '@/features/catalogue/utils/print-form';
import { StaleEditNotice as Notice } from '@/components/ui/stale-edit-notice';

export interface StaleEditNoticeProps {
  changes: StaleChange[];
  lastChangedBy: string | null;
  lastChangedAt: string | null;
  currentVersion: number;
  describeMine: (field: PrintField) => string;
  onReapply: () => void;
  onDiscard: () => void;
}

/** Someone saved the print while this form was open. */
export function StaleEditNotice(props: StaleEditNoticeProps) {
  return (
    <Notice<PrintField>
      subject="this print"
      caption="Fields changed since you opened the form"
      noChanges="None of the fields in this form changed (the process history or location may have)."
      {...props}
    />
  );
}
