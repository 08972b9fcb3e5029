import { useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { VIEW_TYPE_LABELS, type PrintImage } from '@toneledger/common/schemas/images';
import { SelectField } from '@/components/ui/field';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useImages } from '@/lib/images-api';
import { usePrint } from '@/lib/prints-api';
import { useAlignment } from '@/features/condition/api/alignment';
import { LinkedDeepZoom } from '@/features/condition/components/linked-deep-zoom';
import { OverlayCompare } from '@/features/condition/components/overlay-compare';
import { imageLabel } from '@/features/condition/components/region-drawer';
import { byCapture, choosePair, defaultPair, orderWarning } from '@/features/condition/utils/compare';
import { Button } from '@/components/ui/button';
import { NotLoaded } from '@/features/condition/routes/print-not-loaded';

type Mode = 'side' | 'zoom' | 'overlay';

function Figure({ image, caption }: { image: PrintImage; caption: string }) {
  return (
    <figure className="min-w-0">
      <img src={image.urls.screen ?? ''} alt={`${caption}: ${imageLabel(image)}`} className="block h-auto w-full border border-paper-300 bg-paper-100" />
      <figcaption className="mt-1 text-sm">
        <strong>{caption}</strong> · {imageLabel(image)}
      </figcaption>
    </figure>
  );
}

/** The pair the page opens with: the one in the address, else the earliest and latest recto (or any view with two). */
function initialPair(images: PrintImage[], a: string | null, b: string | null): [string, string] {
  if (a && b) return [a, b];
  const views = ['recto', ...new Set(images.map((i) => i.viewType))];
  for (const view of views) {
    const pair = defaultPair(images.filter((i) => i.viewType === view));
    if (pair) return [pair[0].id, pair[1].id];
  }
  return [a ?? '', b ?? ''];
}

/** Two images of one print side by side, or one over the other with a slider and alignment. */
export function ComparePage() {
  const { id = '' } = useParams();
  const me = useMe();
  const [params, setParams] = useSearchParams();
  const [mode, setMode] = useState<Mode>('side');
  const print = usePrint(id);
  const images = useImages(id);
  const usable = useMemo(() => (images.data ?? []).filter((i) => !i.withdrawn && i.urls.screen).sort(byCapture), [images.data]);
  const [aId, bId] = initialPair(usable, params.get('a'), params.get('b'));
  const a = usable.find((i) => i.id === aId);
  const b = usable.find((i) => i.id === bId);
  const alignment = useAlignment(a && b ? { baseImageId: a.id, otherImageId: b.id } : null);
  useDocumentTitle(print.data ? `Compare images · ${print.data.accessionNumber}` : 'Compare images');

  if (print.isPending || images.isPending) return <Loading label="Loading images…" />;
  if (print.isError) return <NotLoaded error={print.error} what="print" />;
  if (images.isError) return <ErrorNotice error={images.error} title="The images could not be loaded." />;

  function setPair([nextA, nextB]: [string, string]) {
    const next = new URLSearchParams(params);
    next.set('a', nextA);
    next.set('b', nextB);
    setParams(next, { replace: true });
  }
  // Both sides stay of one view: an earlier image of another view brings the later side along.
  const choose = (which: 'a' | 'b', value: string) => setPair(choosePair(usable, which, value, [aId, bId]));
  const backwards = orderWarning(a, b);

  const sameView = a ? usable.filter((i) => i.viewType === a.viewType) : usable;

  return (
    <article>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to={`/condition/prints/${id}`} className="mono">
          {print.data.accessionNumber}
        </Link>{' '}
        <span aria-hidden="true">›</span> Compare images
      </nav>
      <div className="mb-5 border-b border-paper-300 pb-4">
        <h1 className="text-2xl sm:text-[1.75rem]">Compare images</h1>
        <p className="mt-1 text-sm text-ink-700">
          <span className="mono">{print.data.accessionNumber}</span> {print.data.title}
          {a ? ` · ${VIEW_TYPE_LABELS[a.viewType]}` : ''}
        </p>
      </div>

      {usable.length < 2 ? (
        <p className="text-sm text-ink-700">Comparing needs two images of the same view of this print.</p>
      ) : (
        <div className="flex flex-col gap-4">
          <div className="flex flex-wrap items-end gap-3">
            <SelectField label="Earlier image" value={aId} onChange={(e) => choose('a', e.target.value)}>
              {!a ? <option value="">Choose…</option> : null}
              {usable.map((i) => (
                <option key={i.id} value={i.id}>
                  {imageLabel(i)}
                </option>
              ))}
            </SelectField>
            <SelectField label="Later image" value={bId} onChange={(e) => choose('b', e.target.value)}>
              {!b ? <option value="">Choose…</option> : null}
              {sameView.map((i) => (
                <option key={i.id} value={i.id}>
                  {imageLabel(i)}
                </option>
              ))}
            </SelectField>
            {backwards ? (
              <div role="alert" className="flex items-center gap-2 rounded border border-sepia-300 bg-sepia-50 px-2.5 py-1.5 text-sm text-sepia-800">
                <span>{backwards}</span>
                <Button size="sm" onClick={() => setPair([bId, aId])}>
                  Swap them
                </Button>
              </div>
            ) : null}
            <fieldset className="flex items-center gap-3 text-sm">
              <legend className="mb-1 text-xs font-semibold tracking-wide text-ink-700 uppercase">Display</legend>
              <label className="flex items-center gap-1.5">
                <input type="radio" name="compare-mode" checked={mode === 'side'} onChange={() => setMode('side')} /> Side by side
              </label>
              <label className="flex items-center gap-1.5">
                <input type="radio" name="compare-mode" checked={mode === 'zoom'} onChange={() => setMode('zoom')} /> Zoom side by side
              </label>
              <label className="flex items-center gap-1.5">
                <input type="radio" name="compare-mode" checked={mode === 'overlay'} onChange={() => setMode('overlay')} /> Overlay
              </label>
            </fieldset>
          </div>
          {a && b && a.viewType !== b.viewType ? (
            <p className="text-sm text-sepia-800">These two images show different views; a comparison is most useful between images of the same view.</p>
          ) : null}
          {!a || !b || a.id === b.id ? (
            <p className="text-sm text-ink-700">Choose two different images.</p>
          ) : mode === 'side' ? (
            <div className="grid gap-4 md:grid-cols-2">
              <Figure image={a} caption="Earlier" />
              <Figure image={b} caption="Later" />
            </div>
          ) : mode === 'zoom' ? (
            <LinkedDeepZoom key={`${a.id}-${b.id}`} a={a} b={b} />
          ) : alignment.isPending ? (
            <Loading label="Loading the saved alignment…" />
          ) : (
            <>
              {alignment.isError ? <ErrorNotice error={alignment.error} title="The saved alignment could not be loaded; starting unaligned." /> : null}
              <OverlayCompare key={`${a.id}-${b.id}`} base={a} other={b} saved={alignment.data ?? null} maySave={can(me.role, 'images.write')} />
            </>
          )}
        </div>
      )}
    </article>
  );
}
