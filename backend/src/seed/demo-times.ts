/**
 * Dates that keep the demo's invented history consistent in time: a report is signed a few days
 * after its examination (not on the day the seed runs), and a photograph's EXIF names equipment of
 * its period (no digital capture before the mid-1990s: older captures are copy negatives scanned later).
 */

/** The day a report examined on `examinedOn` was signed: 1–10 days later at 16:00 UTC, never after `now`. */
export function signedAtFor(examinedOn: string, pick: (min: number, max: number) => number, now = new Date()): Date {
  const at = new Date(`${examinedOn}T16:00:00Z`);
  at.setUTCDate(at.getUTCDate() + pick(1, 10));
  return at > now ? now : at;
}

export interface CopySetup {
  until: number;
  make: string;
  model: string;
  lens: string | null;
  exposure: string | null;
  f: string | null;
  iso: string | null;
  focal: string | null;
  /** For a capture on film, digitised later: what the file's description says. */
  description: string | null;
}

/** Invented copy set-ups of the Trust's photographers, by period (the last year each was used). */
export const COPY_SETUPS: CopySetup[] = [
  {
    until: 1995, make: 'Corran Imaging', model: 'FS-45 film scanner', lens: null, exposure: null, f: null, iso: null, focal: null,
    description: 'Copy negative (4 × 5 in. film) made on the capture date, scanned later',
  },
  { until: 2002, make: 'Corran Imaging', model: 'Vista 6 scanning back', lens: 'Corran Copy 120 mm', exposure: '1/4', f: '11', iso: '50', focal: '120', description: null },
  { until: 2016, make: 'Keswick Optical', model: 'KX-22 copy camera', lens: 'Keswick Macro 90 mm f/4', exposure: '1/30', f: '8', iso: '100', focal: '90', description: null },
  { until: 9999, make: 'Tallon Camera Works', model: 'TC-61 reproduction camera', lens: 'Tallon Apo 100 mm f/4', exposure: '1/60', f: '8', iso: '64', focal: '100', description: null },
];

export function copySetupFor(date: string): CopySetup {
  const year = Number(date.slice(0, 4));
  return COPY_SETUPS.find((k) => year <= k.until)!;
}

/**
 * When a demo print was first put in its place: on a day of the December of the year in its accession
 * number (the year the Trust accessioned it), after that year's entries and acquisitions (the demo's
 * 2019 gift was acquired in June), at 11:00 UTC; never after `now`. `pick` chooses the day (1–20).
 */
export function placedAtFor(accessionNumber: string, pick: (min: number, max: number) => number, now = new Date()): Date | undefined {
  const year = /^(\d{4})\./.exec(accessionNumber)?.[1];
  if (!year) return undefined;
  const at = new Date(`${year}-12-${String(pick(1, 20)).padStart(2, '0')}T11:00:00Z`);
  return at > now ? now : at;
}
