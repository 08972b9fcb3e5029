import type { ClimateFile } from '@toneledger/common/schemas/climate';
import { Button } from '@/components/ui/button';
import { formatWhen } from '@/features/climate/utils/format';

const STATUS: Record<ClimateFile['status'], string> = { uploaded: 'Waiting for a mapping', checked: 'Checked, not accepted', accepted: 'Accepted', discarded: 'Discarded' };

/** The location's logger files, newest first; a file not yet accepted can be taken up again. */
export function FilesList({ files, onResume }: { files: ClimateFile[]; onResume?: (f: ClimateFile) => void }) {
  if (!files.length) return <p className="text-sm text-ink-700">No logger files loaded for this location.</p>;
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="mb-1 text-left font-serif text-lg">Logger files</caption>
      <thead>
        <tr className="border-b border-paper-300 text-left">
          <th scope="col" className="py-1 pr-3">File</th>
          <th scope="col" className="py-1 pr-3">Status</th>
          <th scope="col" className="py-1 pr-3 text-right">Rows</th>
          <th scope="col" className="py-1 pr-3 text-right">Readings written</th>
          <th scope="col" className="py-1 pr-3">Loaded by</th>
          <th scope="col" className="py-1 pr-3">Span</th>
          <th scope="col" className="py-1 pr-3"><span className="sr-only">Actions</span></th>
        </tr>
      </thead>
      <tbody>
        {files.map((f) => (
          <tr key={f.id} className="border-b border-paper-200">
            <td className="py-1 pr-3">{f.fileName}</td>
            <td className="py-1 pr-3">{STATUS[f.status]}</td>
            <td className="py-1 pr-3 text-right">{f.rowCount.toLocaleString('en-GB')}</td>
            <td className="py-1 pr-3 text-right">{f.acceptedRows === null ? '—' : f.acceptedRows.toLocaleString('en-GB')}</td>
            <td className="py-1 pr-3">{f.uploadedBy.name}, {formatWhen(f.uploadedAt)}</td>
            <td className="py-1 pr-3">{f.check?.firstAt ? `${formatWhen(f.check.firstAt)} – ${formatWhen(f.check.lastAt)}` : '—'}</td>
            <td className="py-1 pr-3">
              {onResume && (f.status === 'uploaded' || f.status === 'checked') ? <Button size="sm" onClick={() => onResume(f)}>Continue</Button> : null}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
