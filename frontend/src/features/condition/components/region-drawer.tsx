import { useId, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import { VIEW_TYPE_LABELS, type PrintImage } from '@toneledger/common/schemas/images';
import type { Region } from '@toneledger/common/schemas/condition';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { formatDay } from '@/features/condition/utils/format';
import {
  addPolygonPoint,
  clamp01,
  isTooSmall,
  rectFromDrag,
  regionProblem,
  round4,
  svgPoints,
  toNormalised,
  type Point,
  type Shape,
} from '@/features/condition/utils/region';

export interface RegionDrawerProps {
  /** Images a region may be drawn on (current ones, with a display copy). */
  images: PrintImage[];
  initial: Region | null;
  /** The image to open first when there is no region yet. */
  suggestedImageId?: string;
  onSave: (region: Region) => void;
  onCancel: () => void;
}

export function imageLabel(image: PrintImage): string {
  return `${VIEW_TYPE_LABELS[image.viewType]} · ${image.capturedOn ? formatDay(image.capturedOn) : `uploaded ${formatDay(image.uploadedAt.slice(0, 10))}`}`;
}

const MARK = 0.006;

/**
 * Draws one region on one of the print's images. A rectangle is dragged; a polygon is clicked point
 * by point and closed with a double-click or Enter; Escape cancels the shape being drawn. Every point
 * can also be typed, so the region can be made without a pointer. Points are kept as fractions of the
 * image's width and height, so the region fits the image at any size.
 */
export function RegionDrawer({ images, initial, suggestedImageId, onSave, onCancel }: RegionDrawerProps) {
  const uid = useId();
  const helpId = `${uid}-help`;
  const [imageId, setImageId] = useState(initial?.imageId ?? suggestedImageId ?? images[0]?.id ?? '');
  const [shape, setShape] = useState<Shape>(initial?.shape ?? 'rect');
  const [points, setPoints] = useState<Point[]>((initial?.points as Point[] | undefined) ?? []);
  const [closed, setClosed] = useState(initial?.shape === 'polygon');
  const [edits, setEdits] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [status, setStatus] = useState('');
  const dragStart = useRef<Point | null>(null);
  const image = images.find((i) => i.id === imageId);

  function replace(next: Point[], isClosed = closed) {
    setPoints(next);
    setClosed(isClosed);
    setEdits({});
    setProblem(null);
  }

  function pointAt(event: { clientX: number; clientY: number; currentTarget: Element }): Point {
    return toNormalised(event.clientX, event.clientY, event.currentTarget.getBoundingClientRect());
  }

  function onPointerDown(event: PointerEvent<HTMLDivElement>) {
    if (shape !== 'rect' || event.button !== 0) return;
    const p = pointAt(event);
    dragStart.current = p;
    if (typeof event.currentTarget.setPointerCapture === 'function') {
      try {
        event.currentTarget.setPointerCapture(event.pointerId);
      } catch {
        // Capture is a nicety: a drag that leaves the image still ends at its edge.
      }
    }
    replace([p, p]);
  }

  function onPointerMove(event: PointerEvent<HTMLDivElement>) {
    if (shape !== 'rect' || !dragStart.current) return;
    setPoints(rectFromDrag(dragStart.current, pointAt(event)));
  }

  function onPointerUp(event: PointerEvent<HTMLDivElement>) {
    if (shape !== 'rect' || !dragStart.current) return;
    const rect = rectFromDrag(dragStart.current, pointAt(event));
    dragStart.current = null;
    if (isTooSmall(rect)) {
      replace([]);
      setStatus('Too small to be a rectangle: drag across the area.');
      return;
    }
    replace(rect);
    setStatus(`Rectangle from ${rect[0].join(', ')} to ${rect[1].join(', ')}.`);
  }

  function onClick(event: { clientX: number; clientY: number; currentTarget: Element }) {
    if (shape !== 'polygon' || closed) return;
    const next = addPolygonPoint(points, pointAt(event));
    if (next !== points) {
      replace(next, false);
      setStatus(`Point ${next.length} added.${next.length >= 3 ? ' Double-click or press Enter to close the polygon.' : ''}`);
    }
  }

  function close() {
    if (shape === 'polygon' && !closed && points.length >= 3) {
      setClosed(true);
      setStatus(`Polygon closed with ${points.length} points.`);
    }
  }

  function onKeyDown(event: KeyboardEvent<HTMLElement>) {
    if (event.key === 'Enter') {
      event.preventDefault();
      close();
    } else if (event.key === 'Escape') {
      event.preventDefault();
      event.stopPropagation();
      const drawing = dragStart.current !== null || (shape === 'polygon' && !closed && points.length > 0);
      dragStart.current = null;
      if (drawing) {
        replace([], false);
        setStatus('Drawing cancelled.');
      } else {
        onCancel();
      }
    }
  }

  function changeShape(next: Shape) {
    if (next === shape) return;
    setShape(next);
    replace([], false);
    setStatus('');
  }

  function typed(index: number, axis: 0 | 1, text: string) {
    const key = `${index}-${axis}`;
    setEdits((e) => ({ ...e, [key]: text }));
    const value = Number(text);
    if (text.trim() === '' || !Number.isFinite(value) || value < 0 || value > 1) return;
    setPoints((current) => current.map((p, i) => (i === index ? ((axis === 0 ? [round4(value), p[1]] : [p[0], round4(value)]) as Point) : p)));
    setProblem(null);
  }

  function save() {
    const normalised = points.map(([x, y]) => [round4(clamp01(x)), round4(clamp01(y))] as Point);
    const found = regionProblem(imageId, shape, normalised);
    if (found) {
      setProblem(found);
      return;
    }
    onSave({ imageId, shape, points: normalised });
  }

  if (images.length === 0) {
    return (
      <div className="rounded border border-paper-300 bg-paper-50 p-3 text-sm">
        <p>There is no image of this print to draw on yet. Upload one on the print's condition page, then draw the region.</p>
        <Button size="sm" className="mt-2" onClick={onCancel}>
          Close
        </Button>
      </div>
    );
  }

  const pointLabels = shape === 'rect' ? ['Corner 1', 'Corner 2'] : points.map((_, i) => `Point ${i + 1}`);
  const [a, b] = points;

  return (
    <div className="flex flex-col gap-3 rounded border border-iron-200 bg-iron-50 p-3" onKeyDown={(e) => e.key === 'Escape' && onKeyDown(e)}>
      <div className="flex flex-wrap items-end gap-3">
        <SelectField label="Image" value={imageId} onChange={(e) => setImageId(e.target.value)} fieldClassName="min-w-56">
          {images.map((i) => (
            <option key={i.id} value={i.id}>
              {imageLabel(i)}
            </option>
          ))}
        </SelectField>
        <fieldset className="flex items-center gap-3 text-sm">
          <legend className="mb-1 text-xs font-semibold tracking-wide text-ink-700 uppercase">Shape</legend>
          <label className="flex items-center gap-1.5">
            <input type="radio" name={`${uid}-shape`} checked={shape === 'rect'} onChange={() => changeShape('rect')} /> Rectangle
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" name={`${uid}-shape`} checked={shape === 'polygon'} onChange={() => changeShape('polygon')} /> Polygon
          </label>
        </fieldset>
      </div>
      <p id={helpId} className="text-xs text-ink-700">
        {shape === 'rect'
          ? 'Drag across the area to draw a rectangle. Escape cancels.'
          : 'Click each corner of the area; double-click or press Enter to close the polygon. Escape cancels.'}{' '}
        Or type the points below (0 is the left or top edge of the image, 1 the right or bottom edge).
      </p>
      {image?.urls.screen ? (
        <div
          role="application"
          aria-label="Draw on the image"
          aria-describedby={helpId}
          tabIndex={0}
          onPointerDown={onPointerDown}
          onPointerMove={onPointerMove}
          onPointerUp={onPointerUp}
          onClick={onClick}
          onDoubleClick={close}
          onKeyDown={onKeyDown}
          className="relative max-w-3xl cursor-crosshair touch-none select-none"
        >
          <img src={image.urls.screen} alt="" draggable={false} className="pointer-events-none block h-auto w-full" />
          <svg viewBox="0 0 1 1" preserveAspectRatio="none" className="pointer-events-none absolute inset-0 h-full w-full" aria-hidden="true">
            {shape === 'rect' && a && b ? (
              <rect
                x={Math.min(a[0], b[0])}
                y={Math.min(a[1], b[1])}
                width={Math.abs(b[0] - a[0])}
                height={Math.abs(b[1] - a[1])}
                fill="rgba(154,43,29,0.15)"
                stroke="#9a2b1d"
                strokeWidth={2}
                vectorEffect="non-scaling-stroke"
              />
            ) : null}
            {shape === 'polygon' && points.length > 0 ? (
              closed ? (
                <polygon points={svgPoints(points)} fill="rgba(154,43,29,0.15)" stroke="#9a2b1d" strokeWidth={2} vectorEffect="non-scaling-stroke" />
              ) : (
                <polyline points={svgPoints(points)} fill="none" stroke="#9a2b1d" strokeWidth={2} vectorEffect="non-scaling-stroke" />
              )
            ) : null}
            {points.map(([x, y], i) => (
              <rect key={i} x={x - MARK / 2} y={y - MARK / 2} width={MARK} height={MARK} fill="#9a2b1d" />
            ))}
          </svg>
        </div>
      ) : (
        <p className="text-sm text-ink-700">The display copy of this image is not ready yet; type the points, or choose another image.</p>
      )}
      <p role="status" className="text-xs text-ink-800">
        {status}
      </p>

      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-xs font-semibold tracking-wide text-ink-700 uppercase">Points (fractions of the image, 0–1)</legend>
        {points.length === 0 ? <p className="text-sm text-ink-700">No points yet.</p> : null}
        {points.map((p, i) => (
          <div key={i} className="flex flex-wrap items-center gap-2 text-sm">
            <span className="w-20">{pointLabels[i]}</span>
            {([0, 1] as const).map((axis) => (
              <label key={axis} className="flex items-center gap-1">
                <span>{axis === 0 ? 'x' : 'y'}</span>
                <input
                  type="number"
                  min={0}
                  max={1}
                  step={0.01}
                  aria-label={`${pointLabels[i]} ${axis === 0 ? 'x' : 'y'}`}
                  className="num h-8 w-24 rounded border border-paper-400 bg-white px-2"
                  value={edits[`${i}-${axis}`] ?? String(p[axis])}
                  onChange={(e) => typed(i, axis, e.target.value)}
                  onBlur={() =>
                    setEdits((e) => {
                      const next = { ...e };
                      delete next[`${i}-${axis}`];
                      return next;
                    })
                  }
                />
              </label>
            ))}
            {shape === 'polygon' ? (
              <Button size="sm" variant="quiet" onClick={() => replace(points.filter((_, j) => j !== i), closed && points.length - 1 >= 3)}>
                Remove {pointLabels[i]?.toLowerCase()}
              </Button>
            ) : null}
          </div>
        ))}
        <div className="flex flex-wrap gap-2">
          {shape === 'rect' && points.length < 2 ? (
            <Button size="sm" onClick={() => replace([[0.25, 0.25], [0.75, 0.75]])}>
              Type the corners
            </Button>
          ) : null}
          {shape === 'polygon' ? (
            <Button size="sm" onClick={() => replace([...points, [0.5, 0.5]], false)}>
              Add point
            </Button>
          ) : null}
          {shape === 'polygon' && !closed && points.length >= 3 ? (
            <Button size="sm" onClick={close}>
              Close polygon
            </Button>
          ) : null}
          {points.length > 0 ? (
            <Button size="sm" variant="quiet" onClick={() => replace([], false)}>
              Clear
            </Button>
          ) : null}
        </div>
      </fieldset>

      {problem ? (
        <Notice tone="error" role="alert">
          <p>{problem}</p>
        </Notice>
      ) : null}
      <div className="flex gap-2">
        <Button variant="primary" size="sm" onClick={save}>
          Use this region
        </Button>
        <Button size="sm" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </div>
  );
}
