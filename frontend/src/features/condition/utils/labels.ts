import type { EXTENTS, SEVERITIES, ZONE_AREAS, ZONE_SIDES } from '@toneledger/common/schemas/condition';

export const SIDE_LABELS: Record<(typeof ZONE_SIDES)[number], string> = { recto: 'Recto', verso: 'Verso' };
export const AREA_LABELS: Record<(typeof ZONE_AREAS)[number], string> = {
  image: 'Image', margin: 'Margin', edge: 'Edge', corner: 'Corner', overall: 'Overall',
};
export const EXTENT_LABELS: Record<(typeof EXTENTS)[number], string> = {
  localised: 'Localised', scattered: 'Scattered', overall: 'Overall', percentage: 'Percentage of the area',
};
export const SEVERITY_LABELS: Record<(typeof SEVERITIES)[number], string> = { slight: 'Slight', moderate: 'Moderate', severe: 'Severe' };

export function label<T extends string>(labels: Record<T, string>, value: string): string {
  return (labels as Record<string, string>)[value] ?? value;
}
