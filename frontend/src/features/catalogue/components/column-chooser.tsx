import { useCallback, useId, useState } from 'react';
import type { VisibilityState } from '@tanstack/react-table';
import { Button } from '@/components/ui/button';

const STORAGE_KEY = 'toneledger.catalogue.prints.columns';

function readStored(fallback: VisibilityState): VisibilityState {
  try {
    const raw = window.localStorage.getItem(STORAGE_KEY);
    if (!raw) return fallback;
    const parsed: unknown = JSON.parse(raw);
    if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed)) return fallback;
    return Object.fromEntries(Object.entries(parsed).filter(([, v]) => typeof v === 'boolean')) as VisibilityState;
  } catch {
    return fallback;
  }
}

/**
 * Which columns of the print list are shown. A display preference of this browser, kept in
 * localStorage: it is not part of the list query, so it stays out of the URL (which is exactly
 * what the API receives) and shared links show the recipient's own columns.
 */
export function useColumnVisibility(fallback: VisibilityState) {
  const [visibility, setVisibility] = useState<VisibilityState>(() => readStored(fallback));
  const update = useCallback((next: VisibilityState) => {
    setVisibility(next);
    try {
      window.localStorage.setItem(STORAGE_KEY, JSON.stringify(next));
    } catch {
      // Storage may be full or disabled; the choice then lasts for this page only.
    }
  }, []);
  return [visibility, update] as const;
}

export interface ColumnChooserProps {
  columns: { id: string; label: string }[];
  visibility: VisibilityState;
  onChange: (next: VisibilityState) => void;
}

/** A disclosure with one checkbox per column. */
export function ColumnChooser({ columns, visibility, onChange }: ColumnChooserProps) {
  const [open, setOpen] = useState(false);
  const panelId = useId();
  return (
    <div className="relative">
      <Button aria-expanded={open} aria-controls={panelId} onClick={() => setOpen((o) => !o)}>
        Columns
      </Button>
      <fieldset
        id={panelId}
        hidden={!open}
        className="absolute right-0 z-10 mt-1 w-56 rounded border border-paper-300 bg-white p-3 shadow-md"
        onKeyDown={(event) => {
          if (event.key === 'Escape') setOpen(false);
        }}
      >
        <legend className="sr-only">Columns to show</legend>
        <ul className="flex flex-col gap-1.5 text-sm">
          {columns.map((c) => (
            <li key={c.id}>
              <label className="flex items-center gap-2">
                <input
                  type="checkbox"
                  checked={visibility[c.id] !== false}
                  onChange={(event) => onChange({ ...visibility, [c.id]: event.target.checked })}
                />
                {c.label}
              </label>
            </li>
          ))}
        </ul>
        <Button size="sm" variant="quiet" className="mt-2" onClick={() => setOpen(false)}>
          Done
        </Button>
      </fieldset>
    </div>
  );
}
