import { Link, useNavigate } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useLocations } from '@/lib/reference-api';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useClimateRooms } from '@/features/climate/api/climate';
import { PeriodChooser, usePeriod } from '@/features/climate/components/period-chooser';
import { formatC, formatPermanence, formatRh, formatShare, formatWhen } from '@/features/climate/utils/format';

/** Any location, to open its climate page (and load its first logger file). */
function OpenLocation() {
  const locations = useLocations();
  const navigate = useNavigate();
  const items = locations.data?.data ?? [];
  if (!items.length) return null;
  return (
    <label className="mb-4 flex max-w-md flex-col text-sm print:hidden">
      Open any location
      <select className="rounded border border-paper-400 px-2 py-1" defaultValue="" onChange={(e) => e.target.value && navigate(`/climate/locations/${e.target.value}`)}>
        <option value="">Choose a location…</option>
        {items.map((l) => <option key={l.id} value={l.id}>{l.pathLabel}</option>)}
      </select>
    </label>
  );
}

/** Every store room holding logger readings, its figures over the period side by side. */
export function ClimateRoomsPage() {
  useDocumentTitle('Storage climate');
  const me = useMe();
  const [period, setPeriod] = usePeriod();
  const rooms = useClimateRooms(period);
  return (
    <section>
      <PageHeader
        title="Storage climate"
        description="Each store room's temperature and relative humidity from its loggers: the mean, the share of time outside the targets, the excursions and the relative permanence against the reference climate."
        actions={<Link className="text-sm underline" to="/climate/settings">{can(me.role, 'settings.manage') ? 'Climate settings' : 'Targets and constants'}</Link>}
      />
      <PeriodChooser period={period} onChange={setPeriod} />
      <OpenLocation />
      {rooms.isError ? <ErrorNotice error={rooms.error} title="The rooms could not be loaded." /> : null}
      {rooms.isPending ? <Loading label="Loading rooms…" /> : null}
      {rooms.data && rooms.data.length === 0 ? (
        <Notice tone="info">No location holds logger readings for this period. Open a location to load a logger file.</Notice>
      ) : null}
      {rooms.data && rooms.data.length > 0 ? (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Store rooms over the period</caption>
            <thead>
              <tr className="border-b border-paper-300 text-left">
                <th scope="col" className="py-2 pr-3">Location</th>
                <th scope="col" className="py-2 pr-3 text-right">Permanence</th>
                <th scope="col" className="py-2 pr-3 text-right">Mean temperature</th>
                <th scope="col" className="py-2 pr-3 text-right">Mean RH</th>
                <th scope="col" className="py-2 pr-3 text-right">Time outside targets</th>
                <th scope="col" className="py-2 pr-3 text-right">Excursions</th>
                <th scope="col" className="py-2 pr-3 text-right">Prints</th>
                <th scope="col" className="py-2 pr-3">Last reading</th>
              </tr>
            </thead>
            <tbody>
              {rooms.data.map((r) => (
                <tr key={r.locationId} className="border-b border-paper-200">
                  <th scope="row" className="py-2 pr-3 text-left font-normal">
                    <Link className="underline" to={`/climate/locations/${r.locationId}${period.from || period.to ? `?${new URLSearchParams(period as Record<string, string>)}` : ''}`}>{r.locationLabel}</Link>
                  </th>
                  <td className="py-2 pr-3 text-right font-semibold">{formatPermanence(r.permanence)}</td>
                  <td className="py-2 pr-3 text-right">{formatC(r.temperatureMean)}</td>
                  <td className="py-2 pr-3 text-right">{formatRh(r.rhMean)}</td>
                  <td className="py-2 pr-3 text-right">{formatShare(r.outsideEither)}</td>
                  <td className="py-2 pr-3 text-right">{r.excursions}</td>
                  <td className="py-2 pr-3 text-right">{r.printCount}</td>
                  <td className="py-2 pr-3">{formatWhen(r.lastReadingAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-2 text-xs text-ink-700">
            Permanence 1× lasts as long as the reference climate, 2× twice as long. Excursions count those longer than the brief limit of the settings.
          </p>
        </div>
      ) : null}
    </section>
  );
}
