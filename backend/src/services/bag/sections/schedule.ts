import type { PrintSection } from '../section';

export const printSchedules: PrintSection = {
  key: 'inspectionSchedule', table: 'print_schedules', parentColumn: 'print_id', orderBy: 't.print_id',
  description: 'The print\'s next inspection date, how it was reached, and any override with its reason.',
};

/** After condition reports: an item of a round refers to the report that closed it. */
export const roundItems: PrintSection = {
  key: 'inspectionRounds', table: 'inspection_round_items', parentColumn: 'print_id', orderBy: 't.round_id',
  description: 'The print in an inspection round (data/records/inspection_rounds.jsonl) and the report that answered it.',
};
