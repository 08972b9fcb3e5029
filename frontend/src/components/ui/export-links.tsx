import { buttonClasses } from '@/components/ui/button';

export interface ExportLinksProps {
  /** What is exported, for the group's accessible name ("Loans as shown"). */
  what: string;
  csv: string;
  json?: string;
  /** The CSV's data dictionary (column, meaning, type, unit, source). */
  dictionary: string;
}

/**
 * Download links for a list exactly as shown (the same filters): CSV (UTF-8 with BOM, opens in a
 * spreadsheet), JSON, and the CSV's data dictionary.
 */
export function ExportLinks({ what, csv, json, dictionary }: ExportLinksProps) {
  return (
    <div role="group" aria-label={`Export ${what}`} className="flex flex-wrap items-center gap-2 text-sm">
      <a href={csv} className={buttonClasses('secondary', 'sm')} download>
        Export CSV
      </a>
      {json ? (
        <a href={json} className={buttonClasses('secondary', 'sm')} download>
          Export JSON
        </a>
      ) : null}
      <a href={dictionary} className="text-iron-700 underline underline-offset-2 hover:text-iron-900" download>
        Data dictionary
      </a>
    </div>
  );
}
