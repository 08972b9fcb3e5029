import { useEffect, useRef } from 'react';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { Button } from '@/components/ui/button';
import { iiifInfoUrl } from '@/features/condition/api/iiif';
import { DeepZoom } from '@/features/condition/components/deep-zoom';
import { imageLabel } from '@/features/condition/components/region-drawer';

/** One image filling the window, to zoom and pan; Escape or Close returns to the page. */
export function ImageViewerDialog({ image, onClose }: { image: PrintImage; onClose: () => void }) {
  const dialog = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = dialog.current;
    if (d && !d.open) d.showModal();
    return () => d?.close();
  }, []);
  const label = imageLabel(image);
  return (
    <dialog
      ref={dialog}
      aria-label={`Image viewer: ${label}`}
      onClose={onClose}
      className="m-0 h-dvh max-h-none w-dvw max-w-none bg-ink-900 p-0 backdrop:bg-ink-900/80"
    >
      <div className="flex h-full flex-col">
        <div className="flex items-center justify-between gap-2 bg-white px-3 py-2">
          <h2 className="text-base">{label}</h2>
          <Button size="sm" onClick={() => dialog.current?.close()}>
            Close viewer
          </Button>
        </div>
        <DeepZoom infoUrl={iiifInfoUrl(image.id)} label={label} className="flex-1" />
      </div>
    </dialog>
  );
}
