import { useId, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { VIEW_TYPE_LABELS, type PrintImage } from '@toneledger/common/schemas/images';
import { buttonClasses } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { useImages } from '@/lib/images-api';
import { imageLabel } from '@/features/condition/components/region-drawer';
import { byCapture, defaultPair } from '@/features/condition/utils/compare';

/** Picks two images of the same view to compare, the earliest and the latest unless changed. */
export function CompareChooser({ printId }: { printId: string }) {
  const headingId = useId();
  const images = useImages(printId);
  const usable = useMemo(() => (images.data ?? []).filter((i) => !i.withdrawn && i.urls.screen).sort(byCapture), [images.data]);
  const views = [...new Set(usable.map((i) => i.viewType))].filter((v) => usable.filter((i) => i.viewType === v).length >= 2);
  const [view, setView] = useState<string>('');
  const chosenView = views.includes(view as PrintImage['viewType']) ? view : (views[0] ?? '');
  const ofView = usable.filter((i) => i.viewType === chosenView);
  const pair = defaultPair(ofView);
  const [picked, setPicked] = useState<{ view: string; a: string; b: string } | null>(null);
  const a = picked?.view === chosenView ? picked.a : (pair?.[0].id ?? '');
  const b = picked?.view === chosenView ? picked.b : (pair?.[1].id ?? '');

  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={headingId} className="text-lg">
        Compare
      </h2>
      {images.isPending ? null : views.length === 0 ? (
        <p className="mt-1 text-sm text-ink-700">Comparing needs two images of the same view (for example two recto images from different years).</p>
      ) : (
        <div className="mt-2 flex flex-wrap items-end gap-3">
          <SelectField label="Compare view" value={chosenView} onChange={(e) => setView(e.target.value)}>
            {views.map((v) => (
              <option key={v} value={v}>
                {VIEW_TYPE_LABELS[v]}
              </option>
            ))}
          </SelectField>
          <SelectField label="Earlier image" value={a} onChange={(e) => setPicked({ view: chosenView, a: e.target.value, b })}>
            {ofView.map((i) => (
              <option key={i.id} value={i.id}>
                {imageLabel(i)}
              </option>
            ))}
          </SelectField>
          <SelectField label="Later image" value={b} onChange={(e) => setPicked({ view: chosenView, a, b: e.target.value })}>
            {ofView.map((i) => (
              <option key={i.id} value={i.id}>
                {imageLabel(i)}
              </option>
            ))}
          </SelectField>
          <Link
            to={`/condition/prints/${printId}/compare?a=${encodeURIComponent(a)}&b=${encodeURIComponent(b)}`}
            className={buttonClasses('secondary', 'md', 'no-underline')}
            aria-disabled={a === b || undefined}
          >
            Compare these images
          </Link>
        </div>
      )}
    </section>
  );
}
