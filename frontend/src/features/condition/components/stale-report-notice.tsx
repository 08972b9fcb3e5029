import type { StaleChange } from '@/features/condition/utils/report-form';
import { StaleEditNotice } from '@/components/ui/stale-edit-notice';

export interface StaleReportNoticeProps {
  changes: StaleChange[];
  lastChangedBy: string | null;
  lastChangedAt: string | null;
  currentVersion: number;
  describeMine: (field: StaleChange['field']) => string;
  onReapply: () => void;
  onDiscard: () => void;
}

/** The draft was saved elsewhere (another tab or window) after this form opened. */
export function StaleReportNotice(props: StaleReportNoticeProps) {
  return <StaleEditNotice<StaleChange['field']> subject="this draft" caption="Changed since you opened the draft" noChanges="None of the fields differ." {...props} />;
}
