import type { Display } from '@toneledger/common/schemas/exhibitions';
import { typedNumber } from '@/lib/forms/typed-number';

export interface DisplayFormValues {
  printId: string;
  venueId: string;
  startsOn: string;
  endsOn: string;
  lux: string;
  hoursPerDay: string;
  /** ISO weekdays the room is open, 1 = Monday. */
  daysOpen: number[];
  /** Closed days inside the period, one YYYY-MM-DD a line (or separated by commas). */
  closedDates: string;
  uvMicrowattsPerLumen: string;
  caseOrFrame: string;
  mountNotes: string;
}

export const DISPLAY_LABELS: Record<keyof DisplayFormValues, string> = {
  printId: 'Print',
  venueId: 'Venue',
  startsOn: 'Starts on',
  endsOn: 'Ends on',
  lux: 'Illuminance (lux)',
  hoursPerDay: 'Hours a day',
  daysOpen: 'Days open',
  closedDates: 'Closed dates',
  uvMicrowattsPerLumen: 'UV (µW/lm)',
  caseOrFrame: 'Case or frame',
  mountNotes: 'Mount notes',
};

export function emptyDisplayValues(printId: string, venue?: { id: string; opensOn: string; closesOn: string }): DisplayFormValues {
  return {
    printId, venueId: venue?.id ?? '', startsOn: venue?.opensOn ?? '', endsOn: venue?.closesOn ?? '', lux: '', hoursPerDay: '',
    daysOpen: [1, 2, 3, 4, 5, 6, 7], closedDates: '', uvMicrowattsPerLumen: '', caseOrFrame: '', mountNotes: '',
  };
}

export function displayToValues(d: Display): DisplayFormValues {
  return {
    printId: d.printId, venueId: d.venueId ?? '', startsOn: d.startsOn, endsOn: d.endsOn, lux: String(d.lux), hoursPerDay: String(d.hoursPerDay),
    daysOpen: [...d.daysOpen], closedDates: d.closedDates.join('\n'), uvMicrowattsPerLumen: d.uvMicrowattsPerLumen == null ? '' : String(d.uvMicrowattsPerLumen),
    caseOrFrame: d.caseOrFrame ?? '', mountNotes: d.mountNotes ?? '',
  };
}

/** The closed dates as typed, one per line or separated by commas or spaces; each is checked by the schema. */
export function closedDateList(text: string): string[] {
  return text.split(/[\s,;]+/).filter((d) => d !== '');
}

/** The form as the request body (the print is left out of an edit). */
export function displayValuesToBody(values: DisplayFormValues, editing: boolean): Record<string, unknown> {
  const body: Record<string, unknown> = {
    venueId: values.venueId === '' ? null : values.venueId,
    startsOn: values.startsOn,
    endsOn: values.endsOn,
    lux: typedNumber(values.lux),
    hoursPerDay: typedNumber(values.hoursPerDay),
    daysOpen: [...values.daysOpen].sort((a, b) => a - b),
    closedDates: closedDateList(values.closedDates),
    uvMicrowattsPerLumen: typedNumber(values.uvMicrowattsPerLumen),
    caseOrFrame: values.caseOrFrame,
    mountNotes: values.mountNotes,
  };
  if (!editing) body.printId = values.printId;
  return body;
}

/** A problem with one closed date (`closedDates.2`) is shown under the closed-dates box. */
export function displayFieldFor(path: string): string {
  return path.startsWith('closedDates.') ? 'closedDates' : path.startsWith('daysOpen.') ? 'daysOpen' : path;
}
