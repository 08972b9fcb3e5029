import type { QueryInterface } from 'sequelize';

/** Condition reports (draft → signed, then addenda only), the deterioration vocabulary, images, fixity and alignments. */
const TERMS: [string, string][] = [
  ['silver_mirroring', 'Silver mirroring'], ['fading', 'Fading'], ['colour_shift', 'Colour shift'], ['yellowing_highlights', 'Yellowing of highlights'],
  ['staining', 'Staining'], ['tide_line', 'Tide line'], ['foxing', 'Foxing'], ['abrasion', 'Abrasion'], ['scratch', 'Scratch'],
  ['crease', 'Crease'], ['tear', 'Tear'], ['loss', 'Loss'], ['emulsion_cracking', 'Emulsion cracking'], ['emulsion_lifting', 'Emulsion lifting'],
  ['cockling', 'Cockling'], ['accretion', 'Accretion'], ['mould', 'Mould'], ['insect_damage', 'Insect damage'],
  ['adhesive_residue', 'Adhesive residue'], ['fingerprint', 'Fingerprint'],
];

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE condition_terms (
      code text PRIMARY KEY,
      label text NOT NULL,
      description text,
      active boolean NOT NULL DEFAULT true,
      built_in boolean NOT NULL DEFAULT false,
      position integer NOT NULL DEFAULT 1000
    );

    CREATE TABLE images (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE RESTRICT,
      view_type text NOT NULL CHECK (view_type IN ('recto','verso','raking_light','uv_fluorescence','transmitted_light','detail','before_treatment','after_treatment')),
      captured_on date,
      notes text,
      file_name text NOT NULL,
      content_type text NOT NULL,
      size_bytes bigint NOT NULL,
      width integer NOT NULL,
      height integer NOT NULL,
      sha256 char(64) NOT NULL,
      original_key text NOT NULL UNIQUE,
      thumb_key text,
      screen_key text,
      derivatives text NOT NULL DEFAULT 'pending' CHECK (derivatives IN ('pending','ready','failed')),
      exif jsonb NOT NULL DEFAULT '{}',
      uploaded_by uuid REFERENCES users(id),
      uploaded_by_name text,
      uploaded_at timestamptz NOT NULL DEFAULT now(),
      withdrawn_at timestamptz,
      withdrawn_by_name text,
      withdrawn_reason text,
      purge_after timestamptz,
      purged_at timestamptz,
      version integer NOT NULL DEFAULT 1
    );
    CREATE INDEX images_print_idx ON images (print_id, captured_on);

    CREATE TABLE fixity_checks (
      id bigserial PRIMARY KEY,
      image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
      checked_at timestamptz NOT NULL DEFAULT now(),
      outcome text NOT NULL CHECK (outcome IN ('match','mismatch','missing','error')),
      expected char(64) NOT NULL,
      actual char(64),
      detail text
    );
    CREATE INDEX fixity_checks_image_idx ON fixity_checks (image_id, checked_at DESC);

    CREATE TABLE image_alignments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      base_image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
      other_image_id uuid NOT NULL REFERENCES images(id) ON DELETE CASCADE,
      offset_x double precision NOT NULL,
      offset_y double precision NOT NULL,
      scale double precision NOT NULL,
      rotation_deg double precision NOT NULL DEFAULT 0,
      saved_by_name text,
      saved_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (base_image_id, other_image_id)
    );

    CREATE TABLE condition_reports (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE RESTRICT,
      examined_on date NOT NULL,
      examiner_id uuid REFERENCES users(id),
      examiner_name text NOT NULL,
      context text NOT NULL CHECK (context IN ('routine','incoming','outgoing_loan','returning_loan','before_display','after_display','after_treatment','survey')),
      grade text CHECK (grade IN ('good','fair','poor','unacceptable')),
      summary text,
      recommendations text,
      next_check_on date,
      status text NOT NULL DEFAULT 'draft' CHECK (status IN ('draft','signed')),
      signed_at timestamptz,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (status = 'draft' OR (signed_at IS NOT NULL AND grade IS NOT NULL))
    );
    CREATE INDEX condition_reports_print_idx ON condition_reports (print_id, examined_on DESC);

    CREATE TABLE observations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      report_id uuid NOT NULL REFERENCES condition_reports(id) ON DELETE CASCADE,
      position integer NOT NULL,
      term_code text NOT NULL REFERENCES condition_terms(code),
      side text NOT NULL CHECK (side IN ('recto','verso')),
      area text NOT NULL CHECK (area IN ('image','margin','edge','corner','overall')),
      extent text NOT NULL CHECK (extent IN ('localised','scattered','overall','percentage')),
      extent_percent numeric CHECK (extent_percent BETWEEN 0 AND 100),
      severity text NOT NULL CHECK (severity IN ('slight','moderate','severe')),
      notes text,
      region jsonb,
      region_image_id uuid REFERENCES images(id),
      UNIQUE (report_id, position)
    );

    CREATE TABLE addenda (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      report_id uuid NOT NULL REFERENCES condition_reports(id) ON DELETE RESTRICT,
      author_id uuid REFERENCES users(id),
      author_name text NOT NULL,
      written_at timestamptz NOT NULL DEFAULT now(),
      text text NOT NULL
    );
    CREATE INDEX addenda_report_idx ON addenda (report_id, written_at);

    -- A signed report is locked at the database too: no change to it or its observations, no deletion.
    CREATE FUNCTION condition_reports_locked() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF OLD.status = 'signed' THEN RAISE EXCEPTION 'condition report % is signed and locked', OLD.id; END IF;
      IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER condition_reports_lock BEFORE UPDATE OR DELETE ON condition_reports
      FOR EACH ROW EXECUTE FUNCTION condition_reports_locked();
    CREATE FUNCTION observations_locked() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE s text;
    BEGIN
      SELECT status INTO s FROM condition_reports WHERE id = COALESCE(NEW.report_id, OLD.report_id);
      IF s = 'signed' THEN RAISE EXCEPTION 'observations of a signed report are locked'; END IF;
      IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER observations_lock BEFORE INSERT OR UPDATE OR DELETE ON observations
      FOR EACH ROW EXECUTE FUNCTION observations_locked();
    CREATE FUNCTION addenda_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN RAISE EXCEPTION 'addenda are append-only'; END $$;
    CREATE TRIGGER addenda_no_change BEFORE UPDATE OR DELETE ON addenda FOR EACH ROW EXECUTE FUNCTION addenda_append_only();
  `);
  await qi.bulkInsert(
    'condition_terms',
    TERMS.map(([code, label], i) => ({ code, label, built_in: true, active: true, position: i + 1 })),
  );
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TABLE addenda; DROP TABLE observations; DROP TABLE condition_reports; DROP FUNCTION condition_reports_locked();
    DROP FUNCTION observations_locked(); DROP FUNCTION addenda_append_only();
    DROP TABLE image_alignments; DROP TABLE fixity_checks; DROP TABLE images; DROP TABLE condition_terms;
  `);
}
