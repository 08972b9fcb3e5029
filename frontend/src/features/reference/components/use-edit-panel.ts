import { useState } from 'react';

/** Which record the side panel shows: none (closed), a new one, or an existing one. */
export function useEditPanel<R extends { id: string }>() {
  const [panel, setPanel] = useState<{ record: R | null } | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  return {
    panel,
    saved,
    openNew: () => {
      setSaved(null);
      setPanel({ record: null });
    },
    openEdit: (record: R) => {
      setSaved(null);
      setPanel({ record });
    },
    close: () => setPanel(null),
    /** Closes the panel and says what was saved. */
    done: (message: string) => {
      setPanel(null);
      setSaved(message);
    },
    /** Remounts the form when another record is opened. */
    key: panel ? (panel.record?.id ?? 'new') : 'closed',
  };
}
