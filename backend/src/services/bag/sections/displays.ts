import type { PrintSection } from '../section';

export const exhibitionObjects: PrintSection = {
  key: 'exhibitions', table: 'exhibition_objects', parentColumn: 'print_id', orderBy: 't.exhibition_id',
  description: 'The print in an exhibition (data/records/exhibitions.jsonl): its approval for display.',
};

/** After the print's exhibitions: a period names the print in one of them. */
export const displayPeriods: PrintSection = {
  key: 'displayPeriods', table: 'display_periods', parentColumn: 'print_id', orderBy: 't.starts_on, t.id',
  description: 'Each period the print was or will be on display: dates, venue, illuminance, hours, days open, closed dates.',
};
