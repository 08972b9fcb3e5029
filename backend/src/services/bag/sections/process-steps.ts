import type { PrintSection } from '../section';

export const processSteps: PrintSection = {
  key: 'processSteps', table: 'process_steps', parentColumn: 'print_id', orderBy: 't.position, t.id',
  description: 'The print\'s process history: each step (developing, toning, washing, …) in order, with its bath and recipe.',
};
