import { useId, useState, type KeyboardEvent } from 'react';
import type { Alignment, PrintImage } from '@toneledger/common/schemas/images';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { formatDateTime } from '@/lib/format';
import { useSaveAlignment } from '@/features/condition/api/alignment';
import { imageLabel } from '@/features/condition/components/region-drawer';
import { IDENTITY, clampAlignment, nudge, overlayTransform, toAlignmentInput, type AlignmentState } from '@/features/condition/utils/alignment';
import { round4 } from '@/features/condition/utils/region';

/** One arrow press moves the overlay this fraction of the base image; with Shift, ten times as far. */
export const NUDGE_STEP = 0.001;

const ARROWS: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };

export interface OverlayCompareProps {
  base: PrintImage;
  other: PrintImage;
  saved: Alignment | null;
  maySave: boolean;
}

/**
 * The later image laid over the earlier one. The Reveal slider uncovers the later image from the
 * left; offset, scale and rotation line the two up, and the alignment can be saved for next time.
 */
export function OverlayCompare({ base, other, saved, maySave }: OverlayCompareProps) {
  const uid = useId();
  const [reveal, setReveal] = useState(50);
  const [state, setState] = useState<AlignmentState>(() =>
    saved ? clampAlignment({ offsetX: saved.offsetX, offsetY: saved.offsetY, scale: saved.scale, rotationDeg: saved.rotationDeg }) : IDENTITY,
  );
  const [savedInfo, setSavedInfo] = useState<Alignment | null>(saved);
  const save = useSaveAlignment();

  function move(dx: number, dy: number, big = false) {
    setState((s) => nudge(s, dx, dy, big ? NUDGE_STEP * 10 : NUDGE_STEP));
  }

  function onKeyDown(event: KeyboardEvent<HTMLDivElement>) {
    const arrow = ARROWS[event.key];
    if (!arrow) return;
    event.preventDefault();
    move(arrow[0], arrow[1], event.shiftKey);
  }

  function setNumber(field: keyof AlignmentState, text: string, factor = 1) {
    const value = Number(text);
    if (text.trim() === '' || !Number.isFinite(value)) return;
    setState((s) => clampAlignment({ ...s, [field]: value / factor }));
  }

  return (
    <div className="flex flex-col gap-4">
      <div
        role="group"
        aria-label="Overlay of the two images; arrow keys move the later image"
        tabIndex={0}
        onKeyDown={onKeyDown}
        className="relative max-w-4xl overflow-hidden border border-paper-300 bg-paper-100"
      >
        <img src={base.urls.screen ?? ''} alt={`Earlier: ${imageLabel(base)}`} className="block h-auto w-full" />
        <div className="absolute inset-0" style={{ clipPath: `inset(0 ${100 - reveal}% 0 0)` }} data-testid="overlay-clip">
          <div className="absolute inset-0" style={{ transform: overlayTransform(state), transformOrigin: 'center' }} data-testid="overlay-transform">
            <img src={other.urls.screen ?? ''} alt={`Later: ${imageLabel(other)}`} className="block h-full w-full object-contain" />
          </div>
        </div>
        <div aria-hidden="true" className="pointer-events-none absolute inset-y-0 w-0.5 bg-sepia-200" style={{ left: `${reveal}%` }} />
      </div>

      <div className="flex max-w-4xl flex-wrap items-center gap-3">
        <label htmlFor={`${uid}-reveal`} className="text-sm font-medium">
          Reveal
        </label>
        <input
          id={`${uid}-reveal`}
          type="range"
          min={0}
          max={100}
          step={1}
          value={reveal}
          onChange={(e) => setReveal(Number(e.target.value))}
          aria-valuetext={`${reveal} % of the later image shown`}
          className="flex-1"
        />
        <span className="num w-40 text-sm text-ink-700">{reveal} % later image</span>
      </div>

      <fieldset className="flex max-w-4xl flex-col gap-3 rounded border border-paper-300 bg-white p-3">
        <legend className="px-1 text-sm font-semibold">Alignment of the later image</legend>
        <div className="flex flex-wrap items-end gap-3 text-sm">
          {(
            [
              ['offsetX', 'Offset x (% of width)', 100, 0.1],
              ['offsetY', 'Offset y (% of height)', 100, 0.1],
              ['scale', 'Scale', 1, 0.001],
              ['rotationDeg', 'Rotation (degrees)', 1, 0.1],
            ] as const
          ).map(([field, text, factor, step]) => (
            <label key={field} className="flex flex-col gap-1">
              <span className="text-xs font-semibold tracking-wide text-ink-700 uppercase">{text}</span>
              <input
                type="number"
                step={step}
                className="num h-8 w-32 rounded border border-paper-400 bg-white px-2"
                value={round4(state[field] * factor)}
                onChange={(e) => setNumber(field, e.target.value, factor)}
              />
            </label>
          ))}
        </div>
        <div className="flex flex-wrap items-center gap-1" role="group" aria-label="Nudge">
          <Button size="sm" onClick={() => move(-1, 0)} aria-label="Nudge left">
            ←
          </Button>
          <Button size="sm" onClick={() => move(0, -1)} aria-label="Nudge up">
            ↑
          </Button>
          <Button size="sm" onClick={() => move(0, 1)} aria-label="Nudge down">
            ↓
          </Button>
          <Button size="sm" onClick={() => move(1, 0)} aria-label="Nudge right">
            →
          </Button>
          <span className="ml-2 text-xs text-ink-700">Or focus the overlay and use the arrow keys (Shift for larger steps).</span>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {maySave ? (
            <Button variant="primary" disabled={save.isPending} onClick={() => save.mutate(toAlignmentInput(base.id, other.id, state), { onSuccess: setSavedInfo })}>
              Save alignment
            </Button>
          ) : null}
          <Button onClick={() => setState(IDENTITY)}>Reset</Button>
          {savedInfo ? (
            <span className="text-xs text-ink-700">
              Saved {formatDateTime(savedInfo.savedAt)}
              {savedInfo.savedBy ? ` by ${savedInfo.savedBy}` : ''}
            </span>
          ) : (
            <span className="text-xs text-ink-700">No alignment saved for these two images.</span>
          )}
        </div>
        {save.isSuccess ? (
          <Notice tone="success" role="status">
            <p>Alignment saved; it is used whenever these two images are compared.</p>
          </Notice>
        ) : null}
        {save.isError ? <ErrorNotice error={save.error} title="The alignment was not saved." /> : null}
      </fieldset>
    </div>
  );
}
