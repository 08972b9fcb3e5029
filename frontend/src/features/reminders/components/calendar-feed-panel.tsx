import { useState } from 'react';
import type { Reminders } from '@toneledger/common/schemas/inspections';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { formatDateTime } from '@/lib/format';
import { useRevokeFeed, useRotateFeed } from '@/features/reminders/api/reminders';

/**
 * The secret calendar address: made here, shown once with a copy button; making a new one ends the
 * old, and ending it stops it working at once.
 */
export function CalendarFeedPanel({ feed }: { feed: Reminders['calendarFeed'] }) {
  const rotate = useRotateFeed();
  const revoke = useRevokeFeed();
  const [copied, setCopied] = useState(false);
  const shown = rotate.data && feed ? rotate.data.url : null;

  const copy = async (url: string) => {
    try {
      await navigator.clipboard.writeText(url);
      setCopied(true);
    } catch {
      setCopied(false);
    }
  };

  return (
    <section aria-labelledby="feed-heading" className="flex flex-col gap-3 rounded border border-paper-300 bg-paper-100 p-4">
      <h2 id="feed-heading" className="text-lg">Calendar</h2>
      <p className="text-sm text-ink-700">
        A private address for your calendar program: each inspection round planned for you shows as an all-day entry with its prints.
        Anyone who has the address can read it, so keep it to yourself.
      </p>
      {rotate.isError ? <ErrorNotice error={rotate.error} title="No address was made." /> : null}
      {revoke.isError ? <ErrorNotice error={revoke.error} title="The address was not ended." /> : null}
      {shown ? (
        <Notice tone="success" role="status" title="Your calendar address">
          <p className="break-all"><code className="mono" data-testid="feed-url">{shown}</code></p>
          <div className="mt-2 flex items-center gap-3">
            <Button size="sm" onClick={() => void copy(shown)}>Copy address</Button>
            <span aria-live="polite" className="text-sm">{copied ? 'Copied.' : ''}</span>
          </div>
          <p className="mt-2 text-sm">
            In your calendar program, choose to subscribe to a calendar from the internet (by URL) and paste this address. It is shown only
            now: if you lose it, make a new one.
          </p>
        </Notice>
      ) : null}
      {feed ? (
        <>
          <p className="text-sm">Your calendar address was made {formatDateTime(feed.createdAt)}.</p>
          <div className="flex flex-wrap gap-3">
            <Button onClick={() => { setCopied(false); rotate.mutate(); }} disabled={rotate.isPending}>Make a new address</Button>
            <Button onClick={() => { rotate.reset(); revoke.mutate(); }} disabled={revoke.isPending}>End the calendar address</Button>
          </div>
          <p className="text-xs text-ink-700">A new address stops the old one working; calendars subscribed to it stop updating.</p>
        </>
      ) : (
        <div>
          <Button variant="primary" onClick={() => { setCopied(false); rotate.mutate(); }} disabled={rotate.isPending}>Make a calendar address</Button>
        </div>
      )}
    </section>
  );
}
