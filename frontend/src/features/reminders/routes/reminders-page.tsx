import { can } from '@toneledger/common/domain/roles';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useReminders } from '@/features/reminders/api/reminders';
import { CalendarFeedPanel } from '@/features/reminders/components/calendar-feed-panel';
import { DigestForm } from '@/features/reminders/components/digest-form';

/** The signed-in person's reminders of the inspection schedule. */
export function RemindersPage() {
  useDocumentTitle('Reminders');
  const me = useMe();
  const reminders = useReminders();
  return (
    <section>
      <PageHeader title="Reminders" description="A weekly e-mail of the prints due for inspection, and your inspection rounds in your own calendar." />
      {reminders.isError ? <ErrorNotice error={reminders.error} title="Your reminders could not be loaded." /> : null}
      {reminders.isPending ? (
        <Loading label="Loading your reminders…" />
      ) : reminders.data ? (
        <div className="grid max-w-3xl gap-5">
          <DigestForm reminders={reminders.data} canPlan={can(me.role, 'schedule.write')} />
          <CalendarFeedPanel feed={reminders.data.calendarFeed} />
        </div>
      ) : null}
    </section>
  );
}
