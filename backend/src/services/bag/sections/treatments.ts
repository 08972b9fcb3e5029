import type { PrintSection } from '../section';

/** After images and condition reports: a treatment names its photographs and the report made after it. */
export const treatments: PrintSection = {
  key: 'treatments', table: 'treatments', parentColumn: 'print_id', orderBy: 't.proposed_on, t.created_at, t.id',
  description: 'Conservation treatments: proposal, approval, the work done, materials, signing; with their photographs and addenda.',
  children: [
    { key: 'images', table: 'treatment_images', parentColumn: 'treatment_id', orderBy: 't.image_id', description: 'An image of the print taken for the treatment (before, during, after).' },
    { key: 'addenda', table: 'addenda', parentColumn: 'treatment_id', where: 't.report_id IS NULL', orderBy: 't.written_at, t.id', description: 'Notes added to a signed treatment record.' },
  ],
};
