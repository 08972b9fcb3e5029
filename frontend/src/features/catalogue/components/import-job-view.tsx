import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { ImportJob, ImportMode } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { formatCount } from '@/lib/format';
import { useCommitImport } from '@/features/catalogue/api/commit-import';
import { ImportRows } from '@/features/catalogue/components/import-rows';

function Progress({ job, label }: { job: ImportJob; label: string }) {
  const total = Math.max(job.totalRows, 0);
  return (
    <div role="status" className="flex flex-col gap-1.5 rounded border border-paper-300 bg-white p-4">
      <p className="text-sm font-medium text-ink-900">{label}</p>
      <progress
        aria-label={label}
        value={job.processedRows}
        max={total || undefined}
        className="h-3 w-full max-w-xl overflow-hidden rounded accent-iron-700"
      />
      <p className="num text-sm text-ink-700">
        {total > 0 ? `${formatCount(job.processedRows)} of ${formatCount(total)} rows` : 'Counting rows…'}
      </p>
    </div>
  );
}

function ErrorRows({ job }: { job: ImportJob }) {
  const twoFiles = Boolean(job.stepsFileName);
  const fileName = (file: 'prints' | 'steps') => (file === 'steps' ? job.stepsFileName : job.fileName);
  return (
    <div className="overflow-x-auto rounded border border-paper-300 bg-white">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="px-3 py-2 text-left font-semibold">
          {formatCount(job.errorCount)} {job.errorCount === 1 ? 'problem' : 'problems'} in {job.fileName}
          {twoFiles ? ` and ${job.stepsFileName}` : ''}
        </caption>
        <thead className="bg-paper-100 text-xs text-ink-700 uppercase">
          <tr>
            {twoFiles ? <th scope="col" className="px-3 py-2">File</th> : null}
            <th scope="col" className="px-3 py-2">Row</th>
            <th scope="col" className="px-3 py-2">Column</th>
            <th scope="col" className="px-3 py-2">Value</th>
            <th scope="col" className="px-3 py-2">Problem</th>
          </tr>
        </thead>
        <tbody>
          {job.errors.map((e, i) => (
            <tr key={`${e.file}-${e.row}-${e.column}-${i}`} className="border-t border-paper-200 align-top">
              {twoFiles ? <td className="px-3 py-1.5">{fileName(e.file)}</td> : null}
              <td className="num px-3 py-1.5">{e.row}</td>
              <td className="px-3 py-1.5">
                <code className="mono text-xs">{e.column}</code>
              </td>
              <td className="px-3 py-1.5 break-all">{e.value ?? <span className="text-ink-600">empty</span>}</td>
              <td className="px-3 py-1.5">{e.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

const plural = (n: number, one: string, many: string) => `${formatCount(n)} ${n === 1 ? one : many}`;

const MODES: { value: ImportMode; label: string; hint: string }[] = [
  { value: 'create_only', label: 'Create only', hint: 'Every row must be a new print; a row whose accession number is in the catalogue stops the import.' },
  { value: 'create_or_update', label: 'Create or update', hint: 'A row whose accession number is in the catalogue updates that print, as an edit would (recorded in its history).' },
];

/** The checked file: what it would do, the choice of mode, and the go-ahead. */
function Ready({ job, onStartAgain }: { job: ImportJob; onStartAgain: () => void }) {
  const commit = useCommitImport();
  const matched = job.toUpdate + job.unchanged;
  // Rows that match prints in the catalogue need a deliberate choice; otherwise there is nothing to choose.
  const [mode, setMode] = useState<ImportMode | null>(matched ? null : 'create_only');
  const blocked = mode === 'create_only' && matched > 0;
  const writes = mode === 'create_or_update' ? job.toCreate + job.toUpdate : job.toCreate;
  const action =
    mode === 'create_or_update' && job.toUpdate
      ? `Create ${plural(job.toCreate, 'print', 'prints')} and update ${formatCount(job.toUpdate)}`
      : `Import ${plural(job.toCreate, 'print', 'prints')}`;
  return (
    <section aria-label="Ready to import" className="flex flex-col gap-3 rounded border border-paper-300 bg-white p-4">
      <h2 className="text-lg">Ready to import</h2>
      <p className="text-sm">
        <span className="num font-semibold">{formatCount(job.totalRows)}</span> {job.totalRows === 1 ? 'row' : 'rows'} in {job.fileName}
        {job.stepsFileName ? ` and ${plural(job.stepRows, 'step', 'steps')} in ${job.stepsFileName}` : ''} were checked and have no problems.
        Nothing has been written yet.
      </p>
      <ul className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
        <li>
          <span className="num font-semibold">{formatCount(job.toCreate)}</span> new {job.toCreate === 1 ? 'print' : 'prints'}
        </li>
        <li>
          <span className="num font-semibold">{formatCount(job.toUpdate)}</span> {job.toUpdate === 1 ? 'print' : 'prints'} to update
        </li>
        <li>
          <span className="num font-semibold">{formatCount(job.unchanged)}</span> unchanged
        </li>
      </ul>
      {job.ignoredColumns.length > 0 ? (
        <p className="text-sm text-ink-700">
          Read but not imported (computed, or kept by Toneledger):{' '}
          {job.ignoredColumns.map((c, i) => (
            <span key={c}>
              {i ? ', ' : ''}
              <code className="mono text-xs">{c}</code>
            </span>
          ))}
          .
        </p>
      ) : null}
      {job.newMakers.length > 0 ? (
        <div className="text-sm">
          <p>{job.newMakers.length === 1 ? 'This maker is' : `These ${job.newMakers.length} makers are`} not in the catalogue and will be created:</p>
          <ul className="mt-1 list-disc pl-6">
            {job.newMakers.map((name) => (
              <li key={name}>{name}</li>
            ))}
          </ul>
        </div>
      ) : (
        <p className="text-sm text-ink-700">Every maker in the file is already in the catalogue.</p>
      )}
      <fieldset className="flex flex-col gap-1.5 text-sm">
        <legend className="mb-1 font-semibold">Rows that match prints already in the catalogue</legend>
        {MODES.map((m) => (
          <label key={m.value} className="flex items-start gap-2">
            <input type="radio" name={`mode-${job.id}`} value={m.value} checked={mode === m.value} onChange={() => setMode(m.value)} className="mt-1" />
            <span>
              <span className="font-medium">{m.label}</span> — {m.hint}
            </span>
          </label>
        ))}
      </fieldset>
      {blocked ? (
        <Notice tone="warning" title="Choose “Create or update” to continue.">
          <p>
            {plural(matched, 'row matches a print', 'rows match prints')} already in the catalogue. Choose “Create or update”, or take{' '}
            {matched === 1 ? 'it' : 'them'} out of the file.
          </p>
        </Notice>
      ) : null}
      {commit.isError ? <ErrorNotice error={commit.error} title="The import did not start." /> : null}
      <div className="flex flex-wrap gap-2">
        <Button variant="primary" disabled={commit.isPending || !mode || blocked || writes === 0} onClick={() => mode && commit.mutate({ id: job.id, mode })}>
          {commit.isPending ? 'Starting…' : action}
        </Button>
        <Button variant="quiet" onClick={onStartAgain} disabled={commit.isPending}>
          Cancel, write nothing
        </Button>
      </div>
      <ImportRows job={job} />
    </section>
  );
}

/** One import job at whatever stage it is: checking, ready to confirm, writing, done, refused or failed. */
export function ImportJobView({ job, onStartAgain }: { job: ImportJob; onStartAgain: () => void }) {
  const again = (
    <Button onClick={onStartAgain} variant="secondary">
      Import another file
    </Button>
  );

  switch (job.status) {
    case 'validating':
      return <Progress job={job} label={`Checking ${job.fileName}…`} />;
    case 'committing':
      return <Progress job={job} label={`Writing prints from ${job.fileName}…`} />;
    case 'ready':
      return <Ready job={job} onStartAgain={onStartAgain} />;
    case 'committed':
      return (
        <div className="flex flex-col gap-3">
          <Notice tone="success" role="status" title="Import finished.">
            <p>
              {formatCount(job.createdPrints)} {job.createdPrints === 1 ? 'print was' : 'prints were'} added to the catalogue from {job.fileName}.
              {job.updatedPrints > 0 ? ` ${plural(job.updatedPrints, 'print was', 'prints were')} updated.` : ''}
            </p>
          </Notice>
          <div className="flex flex-wrap items-center gap-3">
            <Link to="/catalogue?sort=-updatedAt">See the prints, newest first</Link>
            {again}
          </div>
        </div>
      );
    case 'invalid':
      return (
        <div className="flex flex-col gap-3">
          <Notice tone="error" role="alert" title="The file was not imported.">
            <p>
              {formatCount(job.errorCount)} {job.errorCount === 1 ? 'problem was' : 'problems were'} found. Nothing was written to the catalogue.
              Correct the file and import it again.
            </p>
          </Notice>
          <ErrorRows job={job} />
          <div>{again}</div>
        </div>
      );
    case 'failed':
      return (
        <div className="flex flex-col gap-3">
          <Notice tone="error" role="alert" title="The import failed.">
            <p>{job.message ?? 'The server could not finish the import.'} Nothing was written to the catalogue.</p>
          </Notice>
          {job.errors.length > 0 ? <ErrorRows job={job} /> : null}
          <div>{again}</div>
        </div>
      );
  }
}
