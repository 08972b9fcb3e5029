import type { Region } from '@toneledger/common/schemas/condition';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { labelPoint, svgPoints, type Point } from '@/features/condition/utils/region';

export interface MarkedRegion {
  number: number;
  region: Region;
}

/** An image with numbered regions drawn over it (read-only; also used in the printed report). */
export function RegionOverlay({ image, regions, alt }: { image: PrintImage; regions: MarkedRegion[]; alt: string }) {
  if (!image.urls.screen) return <p className="text-sm text-ink-700">The display copy of this image is not ready yet.</p>;
  return (
    <figure className="relative break-inside-avoid">
      <div className="relative">
        <img src={image.urls.screen} alt={alt} className="block h-auto w-full" />
        <svg viewBox="0 0 1 1" preserveAspectRatio="none" className="absolute inset-0 h-full w-full" aria-hidden="true">
          {regions.map(({ number, region }) => {
            const points = region.points as Point[];
            if (region.shape === 'rect') {
              const [[x1, y1], [x2, y2]] = points as [Point, Point];
              return (
                <rect
                  key={number}
                  x={Math.min(x1, x2)}
                  y={Math.min(y1, y2)}
                  width={Math.abs(x2 - x1)}
                  height={Math.abs(y2 - y1)}
                  fill="none"
                  stroke="#9a2b1d"
                  strokeWidth={2}
                  vectorEffect="non-scaling-stroke"
                />
              );
            }
            return <polygon key={number} points={svgPoints(points)} fill="none" stroke="#9a2b1d" strokeWidth={2} vectorEffect="non-scaling-stroke" />;
          })}
        </svg>
        {regions.map(({ number, region }) => {
          const [x, y] = labelPoint(region.points as Point[]);
          return (
            <span
              key={number}
              aria-hidden="true"
              className="absolute -translate-x-1/2 -translate-y-1/2 rounded-full border border-white bg-danger-700 px-1.5 text-xs font-semibold text-white print:border-danger-700"
              style={{ left: `${x * 100}%`, top: `${y * 100}%` }}
            >
              {number}
            </span>
          );
        })}
      </div>
    </figure>
  );
}
