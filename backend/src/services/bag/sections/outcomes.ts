import type { PrintSection } from '../section';

export const printOutcomes: PrintSection = {
  key: 'researchOutcomes', table: 'print_outcomes', parentColumn: 'print_id', orderBy: 't.print_id',
  description: 'Longevity figures computed from the print\'s measurements (fading rate, events) for research.',
};
