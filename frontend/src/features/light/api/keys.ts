/**
 * Query keys for the `light` resource: one print's light dose (`lightApi.print`) and the list of
 * prints whose planned displays would exceed their budget (`lightApi.overBudget`); and for the
 * light section of the settings (`lightSettingsApi`).
 */
export const lightKeys = {
  all: ['light'] as const,
  details: () => [...lightKeys.all, 'detail'] as const,
  /** One print's light dose. */
  detail: (printId: string) => [...lightKeys.details(), printId] as const,
  overBudget: () => [...lightKeys.all, 'over-budget'] as const,
};

export const lightSettingsKeys = {
  all: ['settings', 'light'] as const,
  /** Progress of the recompute a change of the settings starts (`lightApi.recompute`). */
  recompute: () => [...lightSettingsKeys.all, 'recompute'] as const,
};
