/**
 * Getty Art & Architecture Thesaurus (AAT) identifiers the exports put beside codes, so another
 * system can read what a print is without this program. Only identifiers confirmed in the project's
 * reference notes are listed (gelatin silver prints 300128695, albumen prints 300127121, platinum
 * prints 300127145, photographs 300046300); a process without a confirmed identifier gets none.
 * A platinum/palladium print is left out: the confirmed concept names platinum prints only.
 */
/** The AAT's linked-data namespace (recalled from the Getty vocabularies' documentation, not checked here). */
export const AAT_BASE = 'http://vocab.getty.edu/aat/';

export interface AatConcept {
  id: string;
  label: string;
  uri: string;
}

const concept = (id: string, label: string): AatConcept => ({ id, label, uri: `${AAT_BASE}${id}` });

/** Process codes (schemas/vocab.ts PROCESS) with a confirmed AAT concept. */
export const PROCESS_AAT: Partial<Record<string, AatConcept>> = {
  gelatin_silver_developing_out: concept('300128695', 'gelatin silver prints'),
  gelatin_silver_printing_out: concept('300128695', 'gelatin silver prints'),
  albumen: concept('300127121', 'albumen prints'),
};

/** Every print in the collection is a photograph. */
export const OBJECT_TYPE_AAT: AatConcept = concept('300046300', 'photographs');

/** The linked-data identifiers of a print with this process: its object type always, its process when confirmed. */
export function printLinkedData(process: string): { objectType: AatConcept; process: AatConcept | null } {
  return { objectType: OBJECT_TYPE_AAT, process: PROCESS_AAT[process] ?? null };
}
