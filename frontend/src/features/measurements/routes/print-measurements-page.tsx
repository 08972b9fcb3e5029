import { useId, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import type { Print } from '@toneledger/common/schemas/catalogue';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { VIEW_TYPE_LABELS } from '@toneledger/common/schemas/images';
import type { PrintMeasurements, Spot } from '@toneledger/common/schemas/measurements';
import { exportsApi } from '@toneledger/common/api/exports';
import { Button } from '@/components/ui/button';
import { ExportLinks } from '@/components/ui/export-links';
import { SelectField } from '@/components/ui/field';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { SidePanel } from '@/components/ui/side-panel';
import { isApiError, urlOf } from '@/lib/api-client';
import { useMe } from '@/lib/auth';
import { useImages } from '@/lib/images-api';
import { usePrint } from '@/lib/prints-api';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrintMeasurements } from '@/features/measurements/api/get-print-measurements';
import { SessionsTable } from '@/features/measurements/components/sessions-table';
import { SpotCard } from '@/features/measurements/components/spot-card';
import { SpotForm } from '@/features/measurements/components/spot-form';
import { SpotMap, pickImage } from '@/features/measurements/components/spot-map';
import { formatThreshold, identityLine } from '@/features/measurements/utils/format';

function SpotsOnImage({ images, spots }: { images: PrintImage[]; spots: Spot[] }) {
  const [chosen, setChosen] = useState<string | null>(null);
  const usable = images.filter((i) => !i.withdrawn && i.urls.screen);
  const image = usable.find((i) => i.id === chosen) ?? pickImage(usable, spots.map((s) => s.point?.imageId));
  if (!image) return <p className="text-sm text-ink-700">The print has no image with a display copy, so its spots cannot be shown on it.</p>;
  const marks = spots.filter((s) => s.point?.imageId === image.id).map((s) => ({ id: s.id, name: s.name, x: s.point!.x, y: s.point!.y }));
  const elsewhere = spots.filter((s) => !s.point || s.point.imageId !== image.id);
  return (
    <div className="flex flex-col gap-2">
      {usable.length > 1 ? (
        <SelectField label="Show spots on" value={image.id} onChange={(e) => setChosen(e.target.value)} fieldClassName="max-w-xs print:hidden">
          {usable.map((i) => (
            <option key={i.id} value={i.id}>
              {VIEW_TYPE_LABELS[i.viewType]}
              {i.capturedOn ? `, ${i.capturedOn}` : ''}
            </option>
          ))}
        </SelectField>
      ) : null}
      <SpotMap image={image} marks={marks} />
      {elsewhere.length > 0 ? (
        <p className="text-xs text-ink-700">Not placed on this image: {elsewhere.map((s) => s.name).join(', ')}.</p>
      ) : null}
    </div>
  );
}

type Editing = { kind: 'new' } | { kind: 'edit'; spot: Spot } | null;

function MeasurementsView({ print, measurements }: { print: Print; measurements: PrintMeasurements }) {
  const me = useMe();
  const navigate = useNavigate();
  const mayWrite = can(me.role, 'measurements.write');
  const images = useImages(print.id);
  const [editing, setEditing] = useState<Editing>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const spotsId = useId();
  const sessionsId = useId();
  const spots = measurements.spots.map((s) => s.spot);

  return (
    <article>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm print:hidden">
        <Link to="/measurements">Measurements</Link> <span aria-hidden="true">›</span> <span className="mono">{print.accessionNumber}</span>
      </nav>
      <header className="mb-5 flex flex-wrap items-end justify-between gap-3 border-b border-paper-300 pb-4">
        <div className="min-w-0">
          <h1 className="text-2xl sm:text-[1.75rem]">
            <span className="mono">{print.accessionNumber}</span> <span className="font-serif">{print.title}</span>
          </h1>
          <p className="mt-1 text-sm text-ink-700">{identityLine(print)}</p>
        </div>
        {mayWrite ? (
          <div className="flex flex-wrap gap-2 print:hidden">
            <Button
              onClick={() => {
                setSaved(null);
                setEditing({ kind: 'new' });
              }}
            >
              New spot
            </Button>
            <Button variant="primary" onClick={() => navigate(`/measurements/prints/${print.id}/sessions/new`)} disabled={spots.length === 0}>
              Record a session
            </Button>
          </div>
        ) : null}
      </header>

      <div className="mb-5 max-w-4xl text-sm text-ink-800">
        <p>
          A change is counted as noticeable from <strong className="num">ΔE00 {formatThreshold(measurements.threshold)}</strong>.{' '}
          <span className="text-ink-700">{measurements.thresholdGuidance}</span>
        </p>
        <p className="mt-1 text-ink-700">
          Rates and projections are straight-line estimates from the sessions so far. They advise; decisions about the print rest with its conservators.
        </p>
        {mayWrite && spots.length === 0 ? <p className="mt-1">Add a spot before recording a session.</p> : null}
      </div>

      {saved ? (
        <p role="status" className="mb-3 text-sm text-ok-700">
          {saved}
        </p>
      ) : null}

      <section aria-labelledby={spotsId} className="mb-6">
        <h2 id={spotsId} className="mb-2 text-lg">
          Spots on the print
        </h2>
        {editing ? (
          <div className="max-w-4xl">
            <SidePanel
              title={editing.kind === 'new' ? 'New spot' : `Edit spot ${editing.spot.name}`}
              description="Name the spot, say what it measures, and click the image where it is."
              onClose={() => setEditing(null)}
            >
              <SpotForm
                key={editing.kind === 'new' ? 'new' : editing.spot.id}
                printId={print.id}
                spot={editing.kind === 'edit' ? editing.spot : null}
                images={images.data ?? []}
                others={spots}
                onDone={(spot) => {
                  setEditing(null);
                  if (spot) setSaved(`Spot “${spot.name}” saved.`);
                }}
              />
            </SidePanel>
          </div>
        ) : images.isPending ? (
          <Loading label="Loading the images…" />
        ) : images.isError ? (
          <ErrorNotice error={images.error} title="The images could not be loaded." />
        ) : (
          <SpotsOnImage images={images.data} spots={spots} />
        )}
      </section>

      {measurements.spots.length === 0 ? (
        <p className="mb-6 text-sm text-ink-700">No measurement spots are registered on this print yet.</p>
      ) : (
        <div className="mb-6 flex flex-col gap-4">
          {measurements.spots.map((analysis) => (
            <SpotCard
              key={analysis.spot.id}
              analysis={analysis}
              threshold={measurements.threshold}
              sessions={measurements.sessions}
              mayWrite={mayWrite}
              onEdit={() => {
                setSaved(null);
                setEditing({ kind: 'edit', spot: analysis.spot });
              }}
            />
          ))}
        </div>
      )}

      <section aria-labelledby={sessionsId}>
        <h2 id={sessionsId} className="mb-2 text-lg">
          Sessions
        </h2>
        {measurements.sessions.length > 0 ? (
          <div className="mb-2 print:hidden">
            <ExportLinks
              what="this print's readings"
              csv={urlOf(exportsApi.readingsCsv, { query: { printId: print.id } })}
              json={urlOf(exportsApi.readingsJson, { query: { printId: print.id } })}
              dictionary={urlOf(exportsApi.dictionaryCsv, { params: { name: 'readings' } })}
            />
          </div>
        ) : null}
        <SessionsTable sessions={measurements.sessions} />
      </section>
    </article>
  );
}

export function PrintMeasurementsPage() {
  const { id = '' } = useParams();
  const print = usePrint(id);
  const measurements = usePrintMeasurements(id);
  useDocumentTitle(print.data ? `Measurements · ${print.data.accessionNumber}` : 'Measurements');

  const error = print.error ?? measurements.error;
  if (error) {
    const missing = isApiError(error) && error.code === 'not_found';
    return (
      <section className="max-w-2xl">
        <h1 className="text-2xl">{missing ? 'Print not found' : 'The measurements could not be loaded'}</h1>
        <div className="mt-3">
          {missing ? <p className="text-ink-700">There is no print with this address. It may have been deleted.</p> : <ErrorNotice error={error} />}
        </div>
        <p className="mt-4">
          <Link to="/measurements">Back to measurements</Link>
        </p>
      </section>
    );
  }
  if (!print.data || !measurements.data) return <Loading label="Loading the measurements…" />;
  return <MeasurementsView print={print.data} measurements={measurements.data} />;
}
