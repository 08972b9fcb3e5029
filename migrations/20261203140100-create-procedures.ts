import type { QueryInterface } from 'sequelize';

/**
 * The procedure records: object entries, acquisitions (with the prints they accessioned),
 * treatments, deaccessions, and the voiding of a measurement session or an image's capture date.
 *
 * A signed record is locked at the database by one trigger function, `signed_record_locked()`, now
 * shared by condition reports and treatments (the condition reports' own function is replaced by it).
 * A treatment's addenda are rows of the same append-only `addenda` table as a report's, which gains
 * `treatment_id` (each addendum belongs to exactly one of the two).
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE FUNCTION signed_record_locked() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF OLD.status = 'signed' THEN RAISE EXCEPTION '% % is signed and locked', TG_TABLE_NAME, OLD.id; END IF;
      IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
      RETURN NEW;
    END $$;
    DROP TRIGGER condition_reports_lock ON condition_reports;
    CREATE TRIGGER condition_reports_lock BEFORE UPDATE OR DELETE ON condition_reports
      FOR EACH ROW EXECUTE FUNCTION signed_record_locked();
    DROP FUNCTION condition_reports_locked();

    CREATE TABLE object_entries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      entry_number text NOT NULL UNIQUE,
      entered_on date NOT NULL,
      depositor text NOT NULL CHECK (length(depositor) BETWEEN 1 AND 300),
      depositor_contact text,
      reason text NOT NULL CHECK (reason IN ('possible_acquisition','loan_in','enquiry')),
      object_count integer NOT NULL CHECK (object_count >= 1),
      objects_description text NOT NULL,
      return_by date,
      notes text,
      received_by uuid REFERENCES users(id),
      received_by_name text NOT NULL,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX object_entries_entered_idx ON object_entries (entered_on DESC, entry_number DESC);

    CREATE TABLE acquisitions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      entry_id uuid REFERENCES object_entries(id) ON DELETE RESTRICT,
      source text NOT NULL CHECK (length(source) BETWEEN 1 AND 300),
      method text NOT NULL CHECK (method IN ('gift','purchase','bequest','transfer')),
      approved_on date,
      acquired_on date NOT NULL,
      title_document text,
      funds text,
      notes text,
      created_by uuid REFERENCES users(id),
      created_by_name text NOT NULL,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (approved_on IS NULL OR approved_on <= acquired_on)
    );
    CREATE INDEX acquisitions_entry_idx ON acquisitions (entry_id);
    -- A print is accessioned by one acquisition.
    CREATE TABLE acquisition_prints (
      acquisition_id uuid NOT NULL REFERENCES acquisitions(id) ON DELETE CASCADE,
      print_id uuid NOT NULL UNIQUE REFERENCES prints(id) ON DELETE CASCADE,
      PRIMARY KEY (acquisition_id, print_id)
    );

    CREATE TABLE treatments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE RESTRICT,
      status text NOT NULL DEFAULT 'proposed' CHECK (status IN ('proposed','approved','done','signed')),
      conservator_id uuid REFERENCES users(id),
      conservator_name text NOT NULL,
      proposed_on date NOT NULL,
      condition_found text NOT NULL,
      aims text NOT NULL,
      options_considered text,
      chosen_method text NOT NULL,
      approved_by_name text,
      approved_on date,
      approval_note text,
      started_on date,
      completed_on date,
      hours_spent numeric CHECK (hours_spent >= 0),
      summary text,
      steps jsonb NOT NULL DEFAULT '[]',
      materials jsonb NOT NULL DEFAULT '[]',
      after_report_id uuid REFERENCES condition_reports(id),
      signed_at timestamptz,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (status = 'proposed' OR (approved_by_name IS NOT NULL AND approved_on IS NOT NULL)),
      CHECK (status NOT IN ('done','signed') OR completed_on IS NOT NULL),
      CHECK (status <> 'signed' OR signed_at IS NOT NULL),
      CHECK (approved_on IS NULL OR approved_on >= proposed_on),
      CHECK (started_on IS NULL OR completed_on IS NULL OR started_on <= completed_on)
    );
    CREATE INDEX treatments_print_idx ON treatments (print_id, proposed_on DESC);
    CREATE INDEX treatments_status_idx ON treatments (status, proposed_on DESC);
    CREATE TRIGGER treatments_lock BEFORE UPDATE OR DELETE ON treatments FOR EACH ROW EXECUTE FUNCTION signed_record_locked();

    CREATE TABLE treatment_images (
      treatment_id uuid NOT NULL REFERENCES treatments(id) ON DELETE CASCADE,
      image_id uuid NOT NULL REFERENCES images(id),
      stage text NOT NULL CHECK (stage IN ('before','during','after')),
      position integer NOT NULL,
      PRIMARY KEY (treatment_id, image_id)
    );
    CREATE FUNCTION treatment_images_locked() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE s text;
    BEGIN
      SELECT status INTO s FROM treatments WHERE id = COALESCE(NEW.treatment_id, OLD.treatment_id);
      IF s = 'signed' THEN RAISE EXCEPTION 'the images of a signed treatment are locked'; END IF;
      IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER treatment_images_lock BEFORE INSERT OR UPDATE OR DELETE ON treatment_images FOR EACH ROW EXECUTE FUNCTION treatment_images_locked();

    ALTER TABLE addenda ALTER COLUMN report_id DROP NOT NULL;
    ALTER TABLE addenda ADD COLUMN treatment_id uuid REFERENCES treatments(id) ON DELETE RESTRICT;
    ALTER TABLE addenda ADD CONSTRAINT addenda_one_record CHECK ((report_id IS NULL) <> (treatment_id IS NULL));
    CREATE INDEX addenda_treatment_idx ON addenda (treatment_id, written_at) WHERE treatment_id IS NOT NULL;

    CREATE TABLE deaccessions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE RESTRICT,
      status text NOT NULL DEFAULT 'proposed' CHECK (status IN ('proposed','approved','completed','withdrawn')),
      proposed_on date NOT NULL,
      proposed_by uuid REFERENCES users(id),
      proposed_by_name text NOT NULL,
      reason text NOT NULL,
      method text NOT NULL CHECK (method IN ('transfer','return','destruction')),
      recipient text,
      authority text,
      approved_on date,
      completed_on date,
      completed_by_name text,
      final_note text,
      withdrawn_why text,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (status IN ('proposed','withdrawn') OR (authority IS NOT NULL AND approved_on IS NOT NULL)),
      CHECK (status <> 'completed' OR (completed_on IS NOT NULL AND final_note IS NOT NULL)),
      CHECK (approved_on IS NULL OR approved_on >= proposed_on),
      CHECK (completed_on IS NULL OR completed_on >= approved_on)
    );
    CREATE INDEX deaccessions_print_idx ON deaccessions (print_id);
    -- One open (not withdrawn) deaccession per print.
    CREATE UNIQUE INDEX deaccessions_open_key ON deaccessions (print_id) WHERE status <> 'withdrawn';
    -- The final record is kept as completed.
    CREATE FUNCTION deaccessions_final() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF OLD.status IN ('completed','withdrawn') THEN RAISE EXCEPTION 'deaccession % is final', OLD.id; END IF;
      IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER deaccessions_final BEFORE UPDATE OR DELETE ON deaccessions FOR EACH ROW EXECUTE FUNCTION deaccessions_final();

    CREATE TABLE measurement_session_voids (
      session_id uuid PRIMARY KEY REFERENCES measurement_sessions(id),
      print_id uuid NOT NULL REFERENCES prints(id),
      reason text NOT NULL CHECK (length(reason) BETWEEN 3 AND 500),
      voided_by uuid REFERENCES users(id),
      voided_by_name text NOT NULL,
      voided_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX measurement_session_voids_print_idx ON measurement_session_voids (print_id);
    CREATE TRIGGER measurement_session_voids_no_change BEFORE UPDATE OR DELETE ON measurement_session_voids
      FOR EACH ROW EXECUTE FUNCTION measurements_append_only();

    CREATE TABLE image_capture_date_voids (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
      captured_on date NOT NULL,
      reason text NOT NULL CHECK (length(reason) BETWEEN 3 AND 500),
      voided_by uuid REFERENCES users(id),
      voided_by_name text NOT NULL,
      voided_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX image_capture_date_voids_image_idx ON image_capture_date_voids (image_id, voided_at);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TABLE image_capture_date_voids; DROP TABLE measurement_session_voids;
    DROP TABLE deaccessions; DROP FUNCTION deaccessions_final();
    DELETE FROM addenda WHERE treatment_id IS NOT NULL;
    ALTER TABLE addenda DROP CONSTRAINT addenda_one_record; ALTER TABLE addenda DROP COLUMN treatment_id;
    ALTER TABLE addenda ALTER COLUMN report_id SET NOT NULL;
    DROP TABLE treatment_images; DROP FUNCTION treatment_images_locked();
    DROP TABLE treatments; DROP TABLE acquisition_prints; DROP TABLE acquisitions; DROP TABLE object_entries;
    CREATE FUNCTION condition_reports_locked() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF OLD.status = 'signed' THEN RAISE EXCEPTION 'condition report % is signed and locked', OLD.id; END IF;
      IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
      RETURN NEW;
    END $$;
    DROP TRIGGER condition_reports_lock ON condition_reports;
    CREATE TRIGGER condition_reports_lock BEFORE UPDATE OR DELETE ON condition_reports FOR EACH ROW EXECUTE FUNCTION condition_reports_locked();
    DROP FUNCTION signed_record_locked();
  `);
}
