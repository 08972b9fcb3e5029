/** Query keys for storage climate: the rooms, one location's figures, series and files, one file, and the climate settings. */
export interface Period { from?: string; to?: string }

export const climateKeys = {
  all: ['climate'] as const,
  rooms: (p: Period) => [...climateKeys.all, 'rooms', p] as const,
  location: (id: string) => [...climateKeys.all, 'location', id] as const,
  summary: (id: string, p: Period) => [...climateKeys.location(id), 'summary', p] as const,
  series: (id: string, p: Period) => [...climateKeys.location(id), 'series', p] as const,
  files: (id: string) => [...climateKeys.location(id), 'files'] as const,
};

export const climateSettingsKeys = { all: ['settings', 'climate'] as const };
