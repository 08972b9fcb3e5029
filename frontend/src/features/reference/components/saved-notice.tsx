import { Notice } from '@/components/ui/notice';

/** The short confirmation after a save, in a live region that is always there so it is announced. */
export function SavedNotice({ saved }: { saved: string | null | undefined }) {
  return (
    <div aria-live="polite" className="mb-3 empty:hidden">
      {saved ? (
        <Notice tone="success" role="status">
          {saved}
        </Notice>
      ) : null}
    </div>
  );
}
