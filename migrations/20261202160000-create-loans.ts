import type { QueryInterface } from 'sequelize';

/**
 * Loans out and in: the loan, the prints on it (with their insurance value and, for a loan out, the
 * place each print came from so the way back goes there), and the dated changes of status, which are
 * append-only at the database like the audit trail. A condition report can be made for a loan
 * (`condition_reports.loan_id`), and a print lent to the collection is marked `borrowed`.
 * `exhibition_id` refers to an exhibition (the exhibitions migration runs first).
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE loans (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      direction text NOT NULL CHECK (direction IN ('out','in')),
      reference text NOT NULL,
      other_institution text NOT NULL,
      contact_name text,
      contact_email text,
      purpose text NOT NULL CHECK (purpose IN ('exhibition','research','conservation','photography')),
      exhibition_id uuid,
      venue text,
      dispatch_on date,
      opens_on date,
      closes_on date,
      return_on date,
      courier text,
      max_lux numeric,
      max_annual_lux_hours numeric,
      temperature_min_c numeric,
      temperature_max_c numeric,
      rh_min_percent numeric,
      rh_max_percent numeric,
      no_alkaline_buffered_mounts boolean NOT NULL DEFAULT false,
      other_conditions text,
      credit_line text,
      notes text,
      status text NOT NULL DEFAULT 'proposed'
        CHECK (status IN ('proposed','approved','agreed','in_transit','on_loan','returned','declined','cancelled')),
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    DO $$ BEGIN
      IF to_regclass('exhibitions') IS NOT NULL THEN
        ALTER TABLE loans ADD CONSTRAINT loans_exhibition_fk FOREIGN KEY (exhibition_id) REFERENCES exhibitions(id) ON DELETE RESTRICT;
      END IF;
    END $$;
    CREATE UNIQUE INDEX loans_reference_key ON loans (lower(reference));
    CREATE INDEX loans_created_idx ON loans (created_at DESC);

    CREATE TABLE loan_objects (
      loan_id uuid NOT NULL REFERENCES loans(id) ON DELETE CASCADE,
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE RESTRICT,
      position integer NOT NULL,
      insurance_value numeric CHECK (insurance_value >= 0),
      currency text,
      home_location_id uuid REFERENCES locations(id),
      added_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (loan_id, print_id)
    );
    CREATE INDEX loan_objects_print_idx ON loan_objects (print_id);

    CREATE TABLE loan_status_changes (
      id bigserial PRIMARY KEY,
      loan_id uuid NOT NULL REFERENCES loans(id) ON DELETE RESTRICT,
      from_status text,
      to_status text NOT NULL,
      on_date date NOT NULL,
      note text,
      by_id uuid REFERENCES users(id),
      by_name text,
      at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX loan_status_changes_loan_idx ON loan_status_changes (loan_id, id);
    CREATE FUNCTION loan_status_changes_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN RAISE EXCEPTION 'loan_status_changes is append-only'; END $$;
    CREATE TRIGGER loan_status_changes_no_change BEFORE UPDATE OR DELETE ON loan_status_changes
      FOR EACH ROW EXECUTE FUNCTION loan_status_changes_append_only();

    ALTER TABLE condition_reports ADD COLUMN loan_id uuid REFERENCES loans(id) ON DELETE RESTRICT;
    CREATE INDEX condition_reports_loan_idx ON condition_reports (loan_id, print_id) WHERE loan_id IS NOT NULL;

    ALTER TABLE prints ADD COLUMN borrowed boolean NOT NULL DEFAULT false;
    -- The few borrowed prints, so the list can leave them out without losing its index-only scans.
    CREATE INDEX prints_borrowed_idx ON prints (id) WHERE borrowed;
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP INDEX prints_borrowed_idx; ALTER TABLE prints DROP COLUMN borrowed;
    DROP INDEX condition_reports_loan_idx;
    ALTER TABLE condition_reports DROP COLUMN loan_id;
    DROP TABLE loan_status_changes; DROP FUNCTION loan_status_changes_append_only();
    DROP TABLE loan_objects; DROP TABLE loans;
  `);
}
