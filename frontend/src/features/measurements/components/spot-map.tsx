import type { MouseEvent } from 'react';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { VIEW_TYPE_LABELS } from '@toneledger/common/schemas/images';

export interface MapMark {
  id: string;
  name: string;
  x: number;
  y: number;
  /** The spot being placed or edited: drawn apart from the others. */
  active?: boolean;
}

export interface SpotMapProps {
  image: PrintImage;
  marks: MapMark[];
  /** When given, a click on the image places the spot there (coordinates 0–1). */
  onPlace?: (point: { x: number; y: number }) => void;
}

const round = (v: number) => Math.round(Math.min(1, Math.max(0, v)) * 10_000) / 10_000;

/**
 * The print's screen image with its measurement spots drawn over it as labelled dots. The SVG
 * uses the image's own pixel size as its coordinate space, so the dots stay where they were put
 * whatever size the image is shown at.
 */
export function SpotMap({ image, marks, onPlace }: SpotMapProps) {
  const w = image.width || 1000;
  const h = image.height || 1000;
  const unit = Math.max(w, h);
  const r = unit * 0.011;
  const font = unit * 0.026;

  function place(event: MouseEvent<SVGSVGElement>) {
    if (!onPlace) return;
    const box = event.currentTarget.getBoundingClientRect();
    if (box.width === 0 || box.height === 0) return;
    onPlace({ x: round((event.clientX - box.left) / box.width), y: round((event.clientY - box.top) / box.height) });
  }

  const view = VIEW_TYPE_LABELS[image.viewType];
  return (
    <figure className="m-0">
      <div className="relative inline-block max-w-full bg-paper-200">
        {image.urls.screen ? (
          <img src={image.urls.screen} alt={`${view} of the print`} width={w} height={h} className="block h-auto max-h-[32rem] w-auto max-w-full" />
        ) : (
          <div className="flex aspect-[4/3] w-80 items-center justify-center text-sm text-ink-700">The display copy is not ready yet.</div>
        )}
        <svg
          viewBox={`0 0 ${w} ${h}`}
          className={`absolute inset-0 h-full w-full ${onPlace ? 'cursor-crosshair' : ''}`}
          role={onPlace ? 'presentation' : 'img'}
          aria-label={onPlace ? undefined : `Spots on the ${view.toLowerCase()}: ${marks.map((m) => m.name).join(', ') || 'none placed'}`}
          onClick={place}
          data-testid={onPlace ? 'spot-placement' : undefined}
        >
          {marks.map((mark) => {
            const cx = mark.x * w;
            const cy = mark.y * h;
            const anchorEnd = mark.x > 0.55; // labels are long: right of centre, they go to the left of the dot
            return (
              <g key={mark.id}>
                <circle cx={cx} cy={cy} r={r * (mark.active ? 1.3 : 1)} fill={mark.active ? '#9a2b1d' : '#102a44'} stroke="#fff" strokeWidth={r * 0.35} />
                <text
                  x={anchorEnd ? cx - r * 1.8 : cx + r * 1.8}
                  y={cy + font * 0.35}
                  fontSize={font}
                  textAnchor={anchorEnd ? 'end' : 'start'}
                  fill="#201d19"
                  stroke="#fff"
                  strokeWidth={font * 0.18}
                  paintOrder="stroke"
                  fontFamily="Inter Variable, sans-serif"
                  fontWeight={600}
                >
                  {mark.name}
                </text>
              </g>
            );
          })}
        </svg>
      </div>
      <figcaption className="mt-1 text-xs text-ink-700">
        {view}
        {image.capturedOn ? `, photographed ${image.capturedOn}` : ''}
        {onPlace ? ' · click the image to place the spot' : ''}
      </figcaption>
    </figure>
  );
}

/** The image the spots are shown on: the one with most spots placed, else the recto, else the first ready one. */
export function pickImage(images: PrintImage[], spotImageIds: (string | undefined)[]): PrintImage | null {
  const usable = images.filter((i) => !i.withdrawn && i.urls.screen);
  if (usable.length === 0) return null;
  const count = (id: string) => spotImageIds.filter((s) => s === id).length;
  return [...usable].sort((a, b) => count(b.id) - count(a.id) || Number(b.viewType === 'recto') - Number(a.viewType === 'recto'))[0]!;
}
