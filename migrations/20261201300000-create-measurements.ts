import type { QueryInterface } from 'sequelize';

/**
 * Colour and density measurements: registered spots on a print, dated measurement sessions, and
 * per spot and session the readings with their mean and spread. The ranges mirror
 * common/src/schemas/measurements.ts, so no path can store what the contract refuses.
 *
 * Sessions and their readings are the record: once written they are never changed or removed
 * (triggers refuse UPDATE and DELETE). A reading's spot and session belong to the same print, and
 * a spot's chosen baseline is a session that has a reading for that spot; both are foreign keys.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    -- Every element of a readings array is an object with numeric L in 0–100 and a, b in ±200.
    -- Written with CASE so no cast is tried before the type is known.
    CREATE FUNCTION lab_readings_valid(r jsonb) RETURNS boolean LANGUAGE sql IMMUTABLE AS $$
      SELECT CASE WHEN jsonb_typeof(r) = 'array' AND jsonb_array_length(r) BETWEEN 1 AND 20 THEN NOT EXISTS (
        SELECT 1 FROM jsonb_array_elements(r) e
        WHERE NOT (CASE
          WHEN jsonb_typeof(e) = 'object' AND jsonb_typeof(e->'L') = 'number' AND jsonb_typeof(e->'a') = 'number' AND jsonb_typeof(e->'b') = 'number'
          THEN (e->>'L')::numeric BETWEEN 0 AND 100 AND (e->>'a')::numeric BETWEEN -200 AND 200 AND (e->>'b')::numeric BETWEEN -200 AND 200
          ELSE false END)
      ) ELSE false END
    $$;

    CREATE TABLE measurement_sessions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE RESTRICT,
      measured_on date NOT NULL,
      measured_by uuid REFERENCES users(id),
      measured_by_name text,
      instrument text NOT NULL CHECK (length(instrument) BETWEEN 1 AND 200),
      serial text CHECK (length(serial) <= 100),
      illuminant text NOT NULL CHECK (illuminant IN ('D50','D65')),
      observer text NOT NULL CHECK (observer IN ('2','10')),
      geometry text NOT NULL CHECK (geometry IN ('45/0','0/45','d/8')),
      condition text CHECK (condition IN ('M0','M1','M2','M3')),
      aperture text CHECK (length(aperture) <= 50),
      backing text CHECK (length(backing) <= 100),
      notes text CHECK (length(notes) <= 5000),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (id, print_id)
    );
    CREATE INDEX measurement_sessions_print_idx ON measurement_sessions (print_id, measured_on, created_at);

    CREATE TABLE measurement_spots (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE RESTRICT,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 100),
      purpose text NOT NULL CHECK (purpose IN ('dmax','mid_tone','highlight','paper_base')),
      -- {imageId, x, y}: a point on one of the print's images, x and y normalised to 0–1.
      point jsonb CHECK (point IS NULL OR CASE
        WHEN jsonb_typeof(point) = 'object' AND jsonb_typeof(point->'imageId') = 'string' AND jsonb_typeof(point->'x') = 'number' AND jsonb_typeof(point->'y') = 'number'
        THEN (point->>'x')::numeric BETWEEN 0 AND 1 AND (point->>'y')::numeric BETWEEN 0 AND 1
        ELSE false END),
      notes text CHECK (length(notes) <= 2000),
      baseline_session_id uuid REFERENCES measurement_sessions(id) ON DELETE RESTRICT,
      baseline_chosen_by uuid REFERENCES users(id),
      baseline_chosen_by_name text,
      baseline_chosen_at timestamptz,
      baseline_reason text CHECK (length(baseline_reason) BETWEEN 3 AND 500),
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (id, print_id),
      -- A chosen baseline says when and why; no chosen baseline leaves no trace of one.
      CHECK ((baseline_session_id IS NULL) = (baseline_chosen_at IS NULL)),
      CHECK ((baseline_session_id IS NULL) = (baseline_reason IS NULL))
    );
    CREATE UNIQUE INDEX measurement_spots_name_key ON measurement_spots (print_id, lower(name));

    CREATE TABLE spot_readings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      session_id uuid NOT NULL REFERENCES measurement_sessions(id) ON DELETE CASCADE,
      spot_id uuid NOT NULL REFERENCES measurement_spots(id) ON DELETE RESTRICT,
      print_id uuid NOT NULL,
      readings jsonb NOT NULL CHECK (lab_readings_valid(readings)),
      mean_l numeric NOT NULL CHECK (mean_l BETWEEN 0 AND 100),
      mean_a numeric NOT NULL CHECK (mean_a BETWEEN -200 AND 200),
      mean_b numeric NOT NULL CHECK (mean_b BETWEEN -200 AND 200),
      n integer NOT NULL CHECK (n = jsonb_array_length(readings)),
      sd jsonb CHECK ((sd IS NULL) = (n = 1)),
      max_pairwise_de numeric CHECK (max_pairwise_de >= 0),
      density numeric CHECK (density BETWEEN 0 AND 5),
      density_type text CHECK (density_type IN ('visual','status_a')),
      reflectance numeric CHECK (reflectance > 0 AND reflectance <= 1),
      UNIQUE (session_id, spot_id),
      -- The session and the spot are of the same print.
      FOREIGN KEY (session_id, print_id) REFERENCES measurement_sessions(id, print_id),
      FOREIGN KEY (spot_id, print_id) REFERENCES measurement_spots(id, print_id)
    );
    CREATE INDEX spot_readings_spot_idx ON spot_readings (spot_id);
    CREATE INDEX spot_readings_print_idx ON spot_readings (print_id);

    -- A chosen baseline is a session with a reading for this very spot.
    ALTER TABLE measurement_spots ADD CONSTRAINT measurement_spots_baseline_reading_fkey
      FOREIGN KEY (baseline_session_id, id) REFERENCES spot_readings(session_id, spot_id);

    -- Measurements are the record: no change, no deletion.
    CREATE FUNCTION measurements_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN RAISE EXCEPTION '% rows are kept as recorded', TG_TABLE_NAME; END $$;
    CREATE TRIGGER measurement_sessions_no_change BEFORE UPDATE OR DELETE ON measurement_sessions
      FOR EACH ROW EXECUTE FUNCTION measurements_append_only();
    CREATE TRIGGER spot_readings_no_change BEFORE UPDATE OR DELETE ON spot_readings
      FOR EACH ROW EXECUTE FUNCTION measurements_append_only();
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE measurement_spots DROP CONSTRAINT measurement_spots_baseline_reading_fkey;
    DROP TABLE spot_readings; DROP TABLE measurement_spots; DROP TABLE measurement_sessions;
    DROP FUNCTION measurements_append_only(); DROP FUNCTION lab_readings_valid(jsonb);
  `);
}
