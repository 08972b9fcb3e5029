import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';

export interface SidePanelProps {
  title: string;
  description?: ReactNode;
  onClose: () => void;
  children: ReactNode;
}

/**
 * A non-modal panel beside a list, for creating or editing one record without leaving the page.
 * Focus moves to its heading when it opens and back to whatever opened it when it closes;
 * Escape closes it.
 */
export function SidePanel({ title, description, onClose, children }: SidePanelProps) {
  const headingId = useId();
  const headingRef = useRef<HTMLHeadingElement>(null);

  useEffect(() => {
    const opener = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    headingRef.current?.focus();
    return () => {
      if (opener?.isConnected) opener.focus();
    };
  }, []);

  return (
    <section
      role="dialog"
      aria-modal="false"
      aria-labelledby={headingId}
      onKeyDown={(event) => {
        if (event.key === 'Escape') {
          event.stopPropagation();
          onClose();
        }
      }}
      className="rounded border border-paper-300 bg-white p-4 shadow-sm lg:sticky lg:top-4"
    >
      <div className="mb-3 flex items-start justify-between gap-3">
        <div className="min-w-0">
          <h2 id={headingId} ref={headingRef} tabIndex={-1} className="text-lg outline-none">
            {title}
          </h2>
          {description ? <div className="mt-1 text-sm text-ink-700">{description}</div> : null}
        </div>
        <Button size="sm" variant="quiet" onClick={onClose} aria-label={`Close: ${title}`}>
          Close
        </Button>
      </div>
      {children}
    </section>
  );
}
