import { useId, useState, type FormEvent } from 'react';
import type { ImportJob } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { useCreateImport } from '@/features/catalogue/api/create-import';

/** Choose a CSV file and send it to be checked. Nothing is written until the check has passed and the import is confirmed. */
export function ImportUploadForm({ onStarted }: { onStarted: (job: ImportJob) => void }) {
  const [file, setFile] = useState<File | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const upload = useCreateImport();
  const inputId = useId();

  function submit(event: FormEvent) {
    event.preventDefault();
    upload.reset();
    if (!file) {
      setProblem('Choose a CSV file first.');
      return;
    }
    if (!/\.csv$/i.test(file.name)) {
      setProblem(`“${file.name}” is not a .csv file.`);
      return;
    }
    setProblem(null);
    upload.mutate(file, { onSuccess: onStarted });
  }

  return (
    <form onSubmit={submit} aria-label="Upload a CSV file" className="flex flex-col gap-3 rounded border border-paper-300 bg-white p-4" noValidate>
      <div className="flex flex-col gap-1">
        <label htmlFor={inputId} className="text-xs font-semibold tracking-wide text-ink-700 uppercase">
          CSV file
        </label>
        <input
          id={inputId}
          type="file"
          accept=".csv,text/csv"
          aria-invalid={problem ? true : undefined}
          aria-describedby={problem ? `${inputId}-error` : undefined}
          onChange={(event) => {
            setFile(event.target.files?.[0] ?? null);
            setProblem(null);
          }}
          className="text-sm file:mr-3 file:h-9 file:rounded file:border file:border-paper-400 file:bg-white file:px-3 file:text-sm file:font-medium"
        />
        {problem ? (
          <p id={`${inputId}-error`} className="text-xs font-medium text-danger-700">
            {problem}
          </p>
        ) : null}
      </div>
      {upload.isError ? <ErrorNotice error={upload.error} title="The file was not accepted." /> : null}
      <div>
        <Button type="submit" variant="primary" disabled={upload.isPending}>
          {upload.isPending ? 'Uploading…' : 'Import'}
        </Button>
      </div>
    </form>
  );
}
