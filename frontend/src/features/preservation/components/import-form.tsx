import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { useImportBag } from '@/lib/preservation-api';

/**
 * Brings a bag into this installation. A file upload, like images: the server checks the whole bag
 * (every checksum) before writing anything, and refuses an installation that already holds prints.
 */
export function ImportForm({ empty }: { empty: boolean }) {
  const [file, setFile] = useState<File | null>(null);
  const [progress, setProgress] = useState(0);
  const [missing, setMissing] = useState(false);
  const upload = useImportBag();
  function submit(event: FormEvent) {
    event.preventDefault();
    if (!file) {
      setMissing(true);
      return;
    }
    setMissing(false);
    setProgress(0);
    upload.mutate({ file, onProgress: setProgress });
  }
  return (
    <form onSubmit={submit} noValidate aria-labelledby="import-heading" className="flex flex-col gap-3 rounded border border-paper-300 bg-paper-100 p-4">
      <h2 id="import-heading" className="text-lg">Bring in a bag</h2>
      <p className="text-sm text-ink-700">
        For a new installation: every record, image and audit event of a bag exported by this product comes back with its ids and
        accession numbers. The bag is checked first; a file whose checksum does not match stops the import, and nothing is written.
      </p>
      {empty ? null : <Notice tone="info"><p>This installation already holds prints, so a bag cannot be brought in here.</p></Notice>}
      <div className="flex flex-col gap-1">
        <label htmlFor="bag-file" className="font-medium">Bag (.tar)</label>
        <input
          id="bag-file" type="file" accept=".tar,application/x-tar" aria-invalid={missing} aria-describedby={missing ? 'bag-file-error' : undefined}
          onChange={(e) => setFile(e.target.files?.[0] ?? null)}
        />
        {missing ? <p id="bag-file-error" className="text-sm text-red-800">Choose a bag (a .tar file).</p> : null}
      </div>
      {upload.isError ? <ErrorNotice error={upload.error} title="The bag was not taken." /> : null}
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={upload.isPending || !empty}>Upload and bring in</Button>
        <span aria-live="polite" className="text-sm text-ink-700">
          {upload.isPending ? `Uploading… ${Math.round(progress * 100)}%` : upload.isSuccess ? 'Received: the check and the import follow in the list below.' : ''}
        </span>
      </div>
    </form>
  );
}
