import type { PrintSection } from '../section';

export const movements: PrintSection = {
  key: 'movements', table: 'movements', parentColumn: 'print_id', orderBy: 't.moved_at, t.id',
  description: 'Where the print went and when: from and to a location, why, by whom.',
};
