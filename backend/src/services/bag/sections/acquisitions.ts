import type { PrintSection } from '../section';

export const acquisitionPrints: PrintSection = {
  key: 'acquisition', table: 'acquisition_prints', parentColumn: 'print_id', orderBy: 't.acquisition_id',
  description: 'The acquisition the print came in by (data/records/acquisitions.jsonl, with its object entry in object_entries.jsonl).',
};

export const deaccessions: PrintSection = {
  key: 'deaccessions', table: 'deaccessions', parentColumn: 'print_id', orderBy: 't.proposed_on, t.created_at, t.id',
  description: 'Deaccession proposals for the print: reason, authority, approval, completion and final note.',
};
