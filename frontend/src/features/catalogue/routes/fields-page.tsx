import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import { STEP_FIELDS } from '@toneledger/common/fields/step';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { FieldDictionary } from '@/features/catalogue/components/field-dictionary';

/**
 * The data dictionary: every field of a print and of a process step, read from the same tables
 * the contract, the forms, the CSV export and the import use. Restricted fields are listed with
 * everything about them; only who may read their values differs.
 */
export function FieldsPage() {
  useDocumentTitle('Data dictionary');
  return (
    <section className="flex flex-col gap-6">
      <PageHeader
        title="Data dictionary"
        description="Every field of a print record, as the forms, the CSV export and the CSV import name it. Fields marked restricted are described here for everyone; their values are shown only to the roles listed."
      />
      <FieldDictionary
        title="Prints"
        fields={PRINT_FIELDS}
        intro="One row per print in the prints file, in this column order. Computed and system columns are exported and ignored on import."
      />
      <FieldDictionary
        title="Process steps"
        fields={STEP_FIELDS}
        intro="The process history travels in a second file, one row per step: the print's accession number, the step's number, then the step. A print with rows in the steps file gets exactly those steps; a print without keeps its history."
      />
    </section>
  );
}
