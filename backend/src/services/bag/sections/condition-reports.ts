import type { PrintSection } from '../section';

export const conditionReports: PrintSection = {
  key: 'conditionReports', table: 'condition_reports', parentColumn: 'print_id', orderBy: 't.examined_on, t.created_at, t.id',
  description: 'Condition reports (drafts and signed), each with its observations (regions on an image) and the addenda written after signing.',
  children: [
    { key: 'observations', table: 'observations', parentColumn: 'report_id', orderBy: 't.position, t.id', description: 'What the examiner saw: a term, where, how severe, with a region on an image.' },
    { key: 'addenda', table: 'addenda', parentColumn: 'report_id', orderBy: 't.written_at, t.id', description: 'Notes added to a signed report (a signed report never changes).' },
  ],
};
