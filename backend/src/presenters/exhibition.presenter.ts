import type { Display, Exhibition as ExhibitionDto } from '@toneledger/common/schemas/exhibitions';
import { periodExposure } from '@toneledger/common/domain/light-dose';
import type { Exhibition, ExhibitionVenue } from '../models';
import { periodOf, type DisplayRow } from '../services/display-rows';

export function presentDisplay(r: DisplayRow): Display {
  return {
    id: r.id, printId: r.print_id, accessionNumber: r.accession_number, printTitle: r.print_title,
    exhibitionId: r.exhibition_id, exhibitionTitle: r.exhibition_title, venueId: r.venue_id, venueName: r.venue_name,
    startsOn: r.starts_on, endsOn: r.ends_on, lux: r.lux, hoursPerDay: r.hours_per_day, daysOpen: r.days_open,
    closedDates: r.closed_dates, uvMicrowattsPerLumen: r.uv, caseOrFrame: r.case_or_frame, mountNotes: r.mount_notes,
    luxHours: periodExposure(periodOf(r)),
    version: r.version,
  };
}

/** An exhibition with its venues in order; it opens with its first venue and closes with its last. */
export function presentExhibition(e: Exhibition, venues: ExhibitionVenue[], objectCount: number): ExhibitionDto {
  const ordered = [...venues].sort((a, b) => a.position - b.position);
  const opens = ordered.map((v) => v.opensOn).sort()[0];
  const closes = ordered.map((v) => v.closesOn).sort().at(-1);
  return {
    id: e.id, title: e.title, organiser: e.organiser, summary: e.summary,
    venues: ordered.map((v) => ({ id: v.id, name: v.name, place: v.place, opensOn: v.opensOn, closesOn: v.closesOn })),
    opensOn: opens ?? '', closesOn: closes ?? '',
    objectCount, version: e.version, createdAt: e.createdAt.toISOString(), updatedAt: e.updatedAt.toISOString(),
  };
}
