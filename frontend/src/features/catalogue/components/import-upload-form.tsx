import { useId, useState, type FormEvent } from 'react';
import type { ImportJob } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { useCreateImport } from '@/features/catalogue/api/create-import';

interface FileInputProps {
  label: string;
  hint: string;
  problem: string | null;
  onChange: (file: File | null) => void;
}

function FileInput({ label, hint, problem, onChange }: FileInputProps) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-xs font-semibold tracking-wide text-ink-700 uppercase">
        {label}
      </label>
      <p id={`${id}-hint`} className="text-xs text-ink-700">
        {hint}
      </p>
      <input
        id={id}
        type="file"
        accept=".csv,text/csv"
        aria-invalid={problem ? true : undefined}
        aria-describedby={problem ? `${id}-hint ${id}-error` : `${id}-hint`}
        onChange={(event) => onChange(event.target.files?.[0] ?? null)}
        className="text-sm file:mr-3 file:h-9 file:rounded file:border file:border-paper-400 file:bg-white file:px-3 file:text-sm file:font-medium"
      />
      {problem ? (
        <p id={`${id}-error`} className="text-xs font-medium text-danger-700">
          {problem}
        </p>
      ) : null}
    </div>
  );
}

const notCsv = (file: File | null) => (file && !/\.csv$/i.test(file.name) ? `“${file.name}” is not a .csv file.` : null);

/**
 * Choose the prints file (and, if the process histories come too, the steps file) and send them to
 * be checked. Nothing is written until the check has passed and the import is confirmed.
 */
export function ImportUploadForm({ onStarted }: { onStarted: (job: ImportJob) => void }) {
  const [prints, setPrints] = useState<File | null>(null);
  const [steps, setSteps] = useState<File | null>(null);
  const [problems, setProblems] = useState<{ prints: string | null; steps: string | null }>({ prints: null, steps: null });
  const upload = useCreateImport();

  function submit(event: FormEvent) {
    event.preventDefault();
    upload.reset();
    const found = { prints: prints ? notCsv(prints) : 'Choose the CSV file of prints first.', steps: notCsv(steps) };
    setProblems(found);
    if (found.prints || found.steps || !prints) return;
    upload.mutate({ prints, steps }, { onSuccess: onStarted });
  }

  /** A file chosen for one of the two inputs: kept, and its earlier problem cleared. */
  const chosen = (key: 'prints' | 'steps', keep: (file: File | null) => void) => (file: File | null) => {
    keep(file);
    setProblems((p) => ({ ...p, [key]: null }));
  };

  return (
    <form onSubmit={submit} aria-label="Upload CSV files" className="flex flex-col gap-4 rounded border border-paper-300 bg-white p-4" noValidate>
      <FileInput
        label="Prints (CSV)"
        hint="One row per print. A row whose accession number is already in the catalogue can update that print; you choose before anything is written."
        problem={problems.prints}
        onChange={chosen('prints', setPrints)}
      />
      <FileInput
        label="Process steps (CSV, optional)"
        hint="One row per step, by accession number and step number. A print with rows here gets exactly these steps; a print without keeps its history."
        problem={problems.steps}
        onChange={chosen('steps', setSteps)}
      />
      {upload.isError ? <ErrorNotice error={upload.error} title="The files were not accepted." /> : null}
      <div>
        <Button type="submit" variant="primary" disabled={upload.isPending}>
          {upload.isPending ? 'Uploading…' : 'Check the files'}
        </Button>
      </div>
    </form>
  );
}
