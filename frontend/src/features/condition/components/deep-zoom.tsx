import { useEffect, useRef, useState } from 'react';
import OpenSeadragon from 'openseadragon';
import { Button } from '@/components/ui/button';

/**
 * A deep-zoom view of one image through its IIIF image service (OpenSeadragon reads info.json and
 * asks for 512-pixel tiles at the scale shown). Drag to pan, wheel or pinch to zoom; with the image
 * focused the keyboard pans (arrow keys), zooms (+ and −) and fits the whole image (0).
 */
export interface DeepZoomProps {
  /** The IIIF info.json address of the image. */
  infoUrl: string;
  /** What the image is, for the screen reader and the toolbar. */
  label: string;
  /** Called once the viewer exists (and with null when it goes), e.g. to link two viewers. */
  onViewer?: (viewer: OpenSeadragon.Viewer | null) => void;
  /** Show the full-screen button (the dialog has its own). */
  fullScreen?: boolean;
  className?: string;
}

/**
 * OpenSeadragon adds a <style> of its own (hiding the focus outline on touch screens) unless one
 * marked `data-openseadragon-mobile-css` is there. The app's Content-Security-Policy refuses inline
 * styles, and the focus outline should stay: an empty marked element keeps it from trying.
 */
function keepOpenSeadragonStylesOut() {
  if (document.querySelector('style[data-openseadragon-mobile-css]')) return;
  const marker = document.createElement('style');
  marker.setAttribute('data-openseadragon-mobile-css', 'kept out by the app');
  document.head.appendChild(marker);
}

/** The zoom as a share of the image's own pixels: 100 % is one image pixel per screen pixel. */
function pixelZoom(viewer: OpenSeadragon.Viewer): number | null {
  const item = viewer.world.getItemAt(0);
  if (!item) return null;
  return item.viewportToImageZoom(viewer.viewport.getZoom(true));
}

export function DeepZoom({ infoUrl, label, onViewer, fullScreen = true, className = '' }: DeepZoomProps) {
  const frame = useRef<HTMLDivElement>(null);
  const stage = useRef<HTMLDivElement>(null);
  const [viewer, setViewer] = useState<OpenSeadragon.Viewer | null>(null);
  const [zoom, setZoom] = useState<number | null>(null);
  const [failed, setFailed] = useState(false);
  const [isFull, setIsFull] = useState(false);
  const onViewerRef = useRef(onViewer);
  onViewerRef.current = onViewer;

  useEffect(() => {
    if (!stage.current) return undefined;
    keepOpenSeadragonStylesOut();
    const v = OpenSeadragon({
      element: stage.current,
      tileSources: infoUrl,
      // Our own toolbar below; the built-in buttons would need image files of their own.
      showNavigationControl: false,
      drawer: 'canvas',
      crossOriginPolicy: false,
      visibilityRatio: 0.5,
      minZoomImageRatio: 0.8,
      // Up to four screen pixels per image pixel: enough to see grain, not so far that nothing is left.
      maxZoomPixelRatio: 4,
      animationTime: 0.3,
      gestureSettingsMouse: { clickToZoom: false, dblClickToZoom: true },
      keyboardNavEnabled: true,
    });
    v.canvas.setAttribute('aria-label', `${label}: deep-zoom view. Arrow keys pan, plus and minus zoom, 0 shows the whole image.`);
    v.canvas.setAttribute('role', 'img');
    const update = () => setZoom(pixelZoom(v));
    v.addHandler('open', update);
    v.addHandler('animation', update);
    v.addHandler('open-failed', () => setFailed(true));
    setViewer(v);
    onViewerRef.current?.(v);
    return () => {
      onViewerRef.current?.(null);
      setViewer(null);
      v.destroy();
    };
  }, [infoUrl, label]);

  useEffect(() => {
    const change = () => setIsFull(document.fullscreenElement === frame.current);
    document.addEventListener('fullscreenchange', change);
    return () => document.removeEventListener('fullscreenchange', change);
  }, []);

  const zoomBy = (factor: number) => {
    viewer?.viewport.zoomBy(factor);
    viewer?.viewport.applyConstraints();
  };
  const toggleFull = async () => {
    if (document.fullscreenElement) await document.exitFullscreen();
    else await frame.current?.requestFullscreen();
  };

  return (
    <div ref={frame} className={`flex min-h-0 flex-col bg-ink-900 ${className}`}>
      <div ref={stage} className="min-h-0 flex-1" data-testid="deep-zoom-stage" />
      {failed ? (
        <p role="alert" className="bg-white p-2 text-sm text-danger-700">
          The image could not be opened for zooming.
        </p>
      ) : null}
      <div className="flex flex-wrap items-center gap-2 border-t border-paper-300 bg-white px-2 py-1.5" role="toolbar" aria-label={`Zoom ${label}`}>
        <Button size="sm" onClick={() => zoomBy(1.5)} aria-label={`Zoom in on ${label}`}>
          Zoom in
        </Button>
        <Button size="sm" onClick={() => zoomBy(1 / 1.5)} aria-label={`Zoom out of ${label}`}>
          Zoom out
        </Button>
        <Button size="sm" onClick={() => viewer?.viewport.goHome()} aria-label={`Show the whole of ${label}`}>
          Whole image
        </Button>
        {fullScreen ? (
          <Button size="sm" onClick={() => void toggleFull()}>
            {isFull ? 'Leave full screen' : 'Full screen'}
          </Button>
        ) : null}
        <output className="ml-auto text-sm tabular-nums text-ink-700" aria-live="polite" data-testid="deep-zoom-level">
          {zoom === null ? '' : `${Math.round(zoom * 100)} %`}
        </output>
      </div>
    </div>
  );
}
