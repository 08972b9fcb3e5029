import { useCallback, useEffect, useRef, useState } from 'react';
import type OpenSeadragon from 'openseadragon';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { iiifInfoUrl } from '@/features/condition/api/iiif';
import { DeepZoom } from '@/features/condition/components/deep-zoom';
import { imageLabel } from '@/features/condition/components/region-drawer';

/**
 * Two deep-zoom views side by side whose zoom and pan follow each other: moving either moves the
 * other to the same place, as a share of each image's width (so two captures of the same print at
 * different resolutions show the same area). Unticking "Zoom and pan together" lets each move alone.
 */
export function LinkedDeepZoom({ a, b }: { a: PrintImage; b: PrintImage }) {
  const viewers = useRef<[OpenSeadragon.Viewer | null, OpenSeadragon.Viewer | null]>([null, null]);
  const following = useRef(false);
  const [linked, setLinked] = useState(true);
  const linkedRef = useRef(linked);
  linkedRef.current = linked;

  const follow = useCallback((from: 0 | 1) => {
    const source = viewers.current[from];
    const target = viewers.current[from === 0 ? 1 : 0];
    if (!linkedRef.current || following.current || !source || !target) return;
    // The other view is already where this one is going (it set this one): nothing to follow.
    const zoom = source.viewport.getZoom();
    const centre = source.viewport.getCenter();
    const there = target.viewport.getCenter();
    if (Math.abs(target.viewport.getZoom() - zoom) < 1e-9 * zoom && Math.abs(there.x - centre.x) < 1e-9 && Math.abs(there.y - centre.y) < 1e-9) return;
    following.current = true;
    try {
      target.viewport.zoomTo(source.viewport.getZoom(), undefined, true);
      target.viewport.panTo(source.viewport.getCenter(), true);
    } finally {
      following.current = false;
    }
  }, []);

  const attach = useCallback(
    (index: 0 | 1) => (viewer: OpenSeadragon.Viewer | null) => {
      viewers.current[index] = viewer;
      viewer?.addHandler('viewport-change', () => follow(index));
    },
    [follow],
  );
  const attachA = useRef(attach(0)).current;
  const attachB = useRef(attach(1)).current;

  useEffect(() => {
    if (linked) follow(0);
  }, [linked, follow]);

  return (
    <div className="flex flex-col gap-2">
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" checked={linked} onChange={(e) => setLinked(e.target.checked)} /> Zoom and pan together
      </label>
      <div className="grid gap-4 md:grid-cols-2">
        {([[a, 'Earlier', attachA], [b, 'Later', attachB]] as const).map(([image, caption, onViewer]) => (
          <figure key={image.id} className="min-w-0">
            <DeepZoom infoUrl={iiifInfoUrl(image.id)} label={`${caption}: ${imageLabel(image)}`} onViewer={onViewer} className="h-[60vh] border border-paper-300" />
            <figcaption className="mt-1 text-sm">
              <strong>{caption}</strong> · {imageLabel(image)}
            </figcaption>
          </figure>
        ))}
      </div>
    </div>
  );
}
