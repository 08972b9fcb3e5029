import { useId, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { VIEW_TYPES, VIEW_TYPE_LABELS } from '@toneledger/common/schemas/images';
import { Button } from '@/components/ui/button';
import { isApiError } from '@/lib/api-client';
import { imageKeys } from '@/lib/images-api';
import { printKeys } from '@/lib/prints-api';
import { uploadImage, type ImageUpload } from '@/features/condition/api/upload-image';
import { formatBytes } from '@/features/condition/utils/format';

type Status = 'waiting' | 'uploading' | 'done' | 'failed';

interface QueuedFile {
  id: number;
  file: File;
  viewType: ImageUpload['viewType'];
  capturedOn: string;
  notes: string;
  status: Status;
  progress: number;
  error: { title: string; message: string; requestId: string | null } | null;
}

/** What went wrong with one file, in words a person can act on. */
export function describeUploadError(error: unknown): { title: string; message: string; requestId: string | null } {
  if (!isApiError(error)) return { title: 'Not uploaded', message: error instanceof Error ? error.message : 'Something went wrong.', requestId: null };
  const fieldMessage = error.fieldIssues.map((i) => i.message).join(' ');
  const titles: Partial<Record<typeof error.code, string>> = {
    payload_too_large: 'Too large to upload',
    unsupported_media_type: 'Not an image this system accepts',
    validation_failed: error.fieldIssues.some((i) => i.path === 'viewType' || i.path === 'capturedOn') ? 'Check the details' : 'Damaged or incomplete file',
    service_unavailable: 'Image storage is not available; try again later',
    forbidden: 'Not allowed',
  };
  return { title: titles[error.code] ?? 'Not uploaded', message: fieldMessage || error.message, requestId: error.requestId };
}

let nextId = 0;

/**
 * Choose several images, give each its view type and capture date, and upload them one after the
 * other with a progress bar each. A file that fails says why and stays in the list with what was
 * chosen for it; the others carry on.
 */
export function UploadQueue({ printId }: { printId: string }) {
  const uid = useId();
  const queryClient = useQueryClient();
  const [queue, setQueue] = useState<QueuedFile[]>([]);
  const [running, setRunning] = useState(false);
  const inputRef = useRef<HTMLInputElement>(null);

  function patch(id: number, change: Partial<QueuedFile>) {
    setQueue((q) => q.map((item) => (item.id === id ? { ...item, ...change } : item)));
  }

  function add(files: FileList | null) {
    if (!files) return;
    const added = Array.from(files).map<QueuedFile>((file) => ({
      id: (nextId += 1), file, viewType: 'recto', capturedOn: '', notes: '', status: 'waiting', progress: 0, error: null,
    }));
    setQueue((q) => [...q, ...added]);
    if (inputRef.current) inputRef.current.value = '';
  }

  async function start() {
    const todo = queue.filter((item) => item.status === 'waiting' || item.status === 'failed');
    if (todo.length === 0) return;
    setRunning(true);
    for (const item of todo) {
      patch(item.id, { status: 'uploading', progress: 0, error: null });
      try {
        await uploadImage(
          printId,
          { file: item.file, viewType: item.viewType, capturedOn: item.capturedOn || undefined, notes: item.notes.trim() || undefined },
          (progress) => patch(item.id, { progress }),
        );
        patch(item.id, { status: 'done', progress: 1 });
        void queryClient.invalidateQueries({ queryKey: imageKeys.lists() });
      } catch (error) {
        patch(item.id, { status: 'failed', error: describeUploadError(error) });
      }
    }
    setRunning(false);
    await Promise.all([
      queryClient.invalidateQueries({ queryKey: imageKeys.lists() }),
      queryClient.invalidateQueries({ queryKey: printKeys.timeline(printId) }),
    ]);
  }

  const pending = queue.filter((item) => item.status === 'waiting' || item.status === 'failed').length;

  return (
    <section aria-labelledby={`${uid}-heading`} className="rounded border border-dashed border-paper-400 bg-paper-50 p-3">
      <h3 id={`${uid}-heading`} className="text-base">
        Add images
      </h3>
      <div className="mt-2 flex flex-wrap items-center gap-3">
        <label htmlFor={`${uid}-files`} className="text-sm font-medium">
          Choose images
        </label>
        <input id={`${uid}-files`} ref={inputRef} type="file" multiple accept="image/jpeg,image/png,image/tiff,image/webp" onChange={(e) => add(e.target.files)} className="text-sm" />
      </div>
      <p className="mt-1 text-xs text-ink-700">JPEG, PNG, TIFF or WebP; each file is checked by its content, and its SHA-256 is kept for fixity checks.</p>
      {queue.length > 0 ? (
        <ul className="mt-3 flex flex-col gap-2" aria-label="Files to upload">
          {queue.map((item) => (
            <li key={item.id} aria-label={item.file.name} className="rounded border border-paper-300 bg-white p-2 text-sm">
              <div className="flex flex-wrap items-end gap-3">
                <p className="min-w-40 flex-1 break-all">
                  <span className="font-medium">{item.file.name}</span> <span className="text-ink-700">({formatBytes(item.file.size)})</span>
                </p>
                <label className="flex flex-col gap-1">
                  <span className="text-xs font-semibold tracking-wide text-ink-700 uppercase">View type</span>
                  <select
                    className="h-8 rounded border border-paper-400 bg-white px-2"
                    value={item.viewType}
                    disabled={item.status === 'uploading' || item.status === 'done'}
                    onChange={(e) => patch(item.id, { viewType: e.target.value as ImageUpload['viewType'] })}
                  >
                    {VIEW_TYPES.map((v) => (
                      <option key={v} value={v}>
                        {VIEW_TYPE_LABELS[v]}
                      </option>
                    ))}
                  </select>
                </label>
                <label className="flex flex-col gap-1">
                  <span className="text-xs font-semibold tracking-wide text-ink-700 uppercase">Captured on</span>
                  <input
                    type="date"
                    className="h-8 rounded border border-paper-400 bg-white px-2"
                    value={item.capturedOn}
                    disabled={item.status === 'uploading' || item.status === 'done'}
                    onChange={(e) => patch(item.id, { capturedOn: e.target.value })}
                  />
                </label>
                {item.status !== 'uploading' ? (
                  <Button size="sm" variant="quiet" onClick={() => setQueue((q) => q.filter((x) => x.id !== item.id))} aria-label={`Remove ${item.file.name} from the list`}>
                    Remove
                  </Button>
                ) : null}
              </div>
              <div className="mt-2 flex items-center gap-2">
                <progress className="h-2 flex-1" max={1} value={item.progress} aria-label={`Progress of ${item.file.name}`} />
                <span className="w-28 text-xs text-ink-800" role="status">
                  {item.status === 'waiting' ? 'Waiting' : item.status === 'uploading' ? `${Math.round(item.progress * 100)} %` : item.status === 'done' ? 'Uploaded' : 'Failed'}
                </span>
              </div>
              {item.error ? (
                <div role="alert" className="mt-1 text-xs text-danger-700">
                  <p className="font-semibold">{item.error.title}</p>
                  <p>{item.error.message}</p>
                  {item.error.requestId ? (
                    <p>
                      Request id <code className="mono">{item.error.requestId}</code>
                    </p>
                  ) : null}
                </div>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
      <div className="mt-3 flex gap-2">
        <Button variant="primary" onClick={start} disabled={running || pending === 0}>
          Upload
        </Button>
        {queue.some((item) => item.status === 'done') && !running ? (
          <Button variant="quiet" onClick={() => setQueue((q) => q.filter((item) => item.status !== 'done'))}>
            Clear finished
          </Button>
        ) : null}
      </div>
    </section>
  );
}
