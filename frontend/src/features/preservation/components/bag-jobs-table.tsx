import type { BagJob } from '@toneledger/common/schemas/preservation';
import { buttonClasses } from '@/components/ui/button';
import { bagHref } from '@/lib/preservation-api';

const STATUS: Record<BagJob['status'], string> = { queued: 'Waiting to start', running: 'Running', done: 'Finished', failed: 'Failed' };

export function formatBytes(n: number | null): string {
  if (n === null) return '—';
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KB`;
  if (n < 1024 ** 3) return `${(n / 1024 / 1024).toFixed(1)} MB`;
  return `${(n / 1024 ** 3).toFixed(2)} GB`;
}

function what(job: BagJob): string {
  if (job.kind === 'import') return 'Import of a bag';
  if (job.scope === 'collection') return `The whole collection${job.withImages ? '' : ', without images'}`;
  const sel = job.selection;
  const part = sel?.kind === 'ids' ? `${sel.ids.length} chosen print${sel.ids.length === 1 ? '' : 's'}` : 'a catalogue search';
  return `A selection: ${part}${job.withImages ? '' : ', without images'}`;
}

/** One job's progress in words and as a bar. */
export function BagProgress({ job }: { job: BagJob }) {
  const fraction = job.total > 0 ? Math.min(1, job.done / job.total) : job.status === 'done' ? 1 : 0;
  return (
    <div className="min-w-48">
      <p className="text-sm">
        {STATUS[job.status]}
        {job.stage ? ` · ${job.stage}` : ''}
        {job.total > 0 ? ` · ${job.done.toLocaleString('en-GB')} of ${job.total.toLocaleString('en-GB')} prints` : ''}
      </p>
      {job.status === 'running' || job.status === 'queued' ? (
        <progress className="w-full" max={1} value={fraction} aria-label={`${Math.round(fraction * 100)}% done`} />
      ) : null}
      {job.error ? <p className="text-sm text-red-800">{job.error}</p> : null}
      {job.problems.length ? (
        <ul className="mt-1 list-disc pl-5 text-sm">
          {job.problems.slice(0, 20).map((p, i) => (
            <li key={i}>
              {p.path ? <code>{p.path}</code> : null}
              {p.path ? ': ' : ''}
              {p.message}
            </li>
          ))}
          {job.problems.length > 20 ? <li>and {job.problems.length - 20} more</li> : null}
        </ul>
      ) : null}
    </div>
  );
}

/** Exports and imports of bags, newest first. */
export function BagJobsTable({ jobs }: { jobs: BagJob[] }) {
  if (!jobs.length) return <p className="text-sm text-ink-700">No bag has been written or brought in yet.</p>;
  return (
    <table className="w-full border-collapse text-left text-sm">
      <thead>
        <tr className="border-b border-paper-300">
          <th scope="col" className="py-1 pr-3">Started</th>
          <th scope="col" className="py-1 pr-3">What</th>
          <th scope="col" className="py-1 pr-3">By</th>
          <th scope="col" className="py-1 pr-3">Progress</th>
          <th scope="col" className="py-1 pr-3">Size</th>
          <th scope="col" className="py-1">Bag</th>
        </tr>
      </thead>
      <tbody>
        {jobs.map((job) => (
          <tr key={job.id} className="border-b border-paper-200 align-top">
            <td className="py-1 pr-3 whitespace-nowrap">{new Date(job.createdAt).toLocaleString('en-GB')}</td>
            <td className="py-1 pr-3">{what(job)}</td>
            <td className="py-1 pr-3">{job.createdByName ?? '—'}</td>
            <td className="py-1 pr-3"><BagProgress job={job} /></td>
            <td className="py-1 pr-3 whitespace-nowrap">
              {formatBytes(job.sizeBytes)}
              {job.fileCount !== null ? <span className="block text-ink-700">{job.fileCount.toLocaleString('en-GB')} files</span> : null}
            </td>
            <td className="py-1">
              {job.downloadable ? (
                <a href={bagHref(job.id)} download className={buttonClasses('secondary', 'sm', 'no-underline')}>Download</a>
              ) : null}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
