import { useId, useState } from 'react';
import { can, type Role } from '@toneledger/common/domain/roles';
import { VIEW_TYPE_LABELS, type PrintImage } from '@toneledger/common/schemas/images';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { formatDateTime } from '@/lib/format';
import { useImages } from '@/lib/images-api';
import { FixityBadge } from '@/features/condition/components/fixity-badge';
import { ImageDetails } from '@/features/condition/components/image-details';
import { ImageViewerDialog } from '@/features/condition/components/image-viewer-dialog';
import { ManifestLink } from '@/features/condition/components/manifest-link';
import { UploadQueue } from '@/features/condition/components/upload-queue';
import { imageLabel } from '@/features/condition/components/region-drawer';
import { formatDay } from '@/features/condition/utils/format';

function Thumb({ image }: { image: PrintImage }) {
  if (image.urls.thumb) return <img src={image.urls.thumb} alt="" className="aspect-square w-full bg-paper-100 object-contain" />;
  return (
    <span className="flex aspect-square w-full items-center justify-center bg-paper-100 px-2 text-center text-xs text-ink-700">
      {image.derivatives === 'pending' ? 'Preparing display copy…' : image.derivatives === 'failed' ? 'No display copy could be made' : 'No display copy'}
    </span>
  );
}

/** The print's images: thumbnails with view, date and fixity; details of the one selected; uploads. */
export function ImagesPanel({ printId, role }: { printId: string; role: Role }) {
  const headingId = useId();
  const staff = can(role, 'catalogue.read_restricted');
  const [includeWithdrawn, setIncludeWithdrawn] = useState(false);
  const [selected, setSelected] = useState<string | null>(null);
  const [withdrawn, setWithdrawn] = useState<PrintImage | null>(null);
  const [viewing, setViewing] = useState<PrintImage | null>(null);
  const images = useImages(printId, { includeWithdrawn });
  const current = images.data?.find((i) => i.id === selected) ?? null;
  const pending = images.data?.some((i) => i.derivatives === 'pending');

  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id={headingId} className="text-lg">
          Images
        </h2>
        {staff ? (
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={includeWithdrawn} onChange={(e) => setIncludeWithdrawn(e.target.checked)} />
            Show withdrawn images
          </label>
        ) : null}
      </div>
      {withdrawn?.withdrawn ? (
        <Notice tone="info" role="status">
          <p>
            The image was withdrawn. Its files are kept until {formatDateTime(withdrawn.withdrawn.purgeAfter)} and then purged; the record of the
            withdrawal stays.
          </p>
        </Notice>
      ) : null}
      {images.isPending ? <Loading label="Loading images…" /> : null}
      {images.isError ? <ErrorNotice error={images.error} title="The images could not be loaded." /> : null}
      {images.data ? (
        images.data.length === 0 ? (
          <p className="text-sm text-ink-700">No images of this print yet.</p>
        ) : (
          <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" aria-label="Images of this print">
            {images.data.map((image) => (
              <li key={image.id}>
                <button
                  type="button"
                  aria-pressed={selected === image.id}
                  onClick={() => setSelected(selected === image.id ? null : image.id)}
                  className={`flex w-full flex-col gap-1 rounded border p-1.5 text-left text-sm ${
                    selected === image.id ? 'border-iron-600 bg-iron-50' : 'border-paper-300 bg-white hover:bg-paper-50'
                  } ${image.withdrawn ? 'opacity-60' : ''}`}
                >
                  <Thumb image={image} />
                  <span className="font-medium">{VIEW_TYPE_LABELS[image.viewType]}</span>
                  <span className="text-xs text-ink-700">{image.capturedOn ? formatDay(image.capturedOn) : 'Date not recorded'}</span>
                  <span>
                    <FixityBadge result={image.lastFixity} />
                  </span>
                  {image.withdrawn ? <span className="text-xs font-semibold text-sepia-800">Withdrawn</span> : null}
                </button>
                {image.urls.screen && !image.withdrawn ? (
                  <Button size="sm" variant="quiet" className="mt-1 w-full" onClick={() => setViewing(image)} title={`Zoom into ${imageLabel(image)}`}>
                    Zoom in the viewer
                  </Button>
                ) : null}
              </li>
            ))}
          </ul>
        )
      ) : null}
      {images.data && images.data.length > 0 ? <ManifestLink printId={printId} /> : null}
      {viewing ? <ImageViewerDialog key={viewing.id} image={viewing} onClose={() => setViewing(null)} /> : null}
      {pending ? (
        <p role="status" className="mt-2 text-xs text-ink-700">
          Display copies are being made; this list updates by itself.
        </p>
      ) : null}
      {current ? (
        <div className="mt-3">
          <ImageDetails
            key={current.id}
            image={current}
            role={role}
            onWithdrawn={(image) => {
              setWithdrawn(image);
              setSelected(null);
            }}
          />
        </div>
      ) : null}
      {can(role, 'images.write') ? (
        <div className="mt-4">
          <UploadQueue printId={printId} />
        </div>
      ) : null}
    </section>
  );
}
