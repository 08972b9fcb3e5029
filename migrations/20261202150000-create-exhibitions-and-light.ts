import type { QueryInterface } from 'sequelize';

/**
 * Exhibitions, their venues and object lists, the periods a print spends on display, and the light
 * columns of a print.
 *
 * - `display_periods` refuses two periods of one print that share a day, at the database too
 *   (an exclusion constraint over daterange '[]' with btree_gist), so two requests at once cannot
 *   both pass the service's check; the service maps its error (23P01) to the same 409.
 * - `prints.light_responsivity` becomes the effective category, written by the server:
 *   the conservator's override when there is one, else the default from process and toner.
 *   Entered values that differ from the default (the default rules of the light settings) become
 *   overrides with a reason saying where they came from; equal ones become the default.
 * - `prints.over_light_budget` is set by the light service when the print's displays, as planned,
 *   take it past its annual budget; it adds the warning `over_light_budget` to `warning_codes`.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE EXTENSION IF NOT EXISTS btree_gist;

    CREATE TABLE exhibitions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      title text NOT NULL,
      organiser text,
      summary text,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE exhibition_venues (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      exhibition_id uuid NOT NULL REFERENCES exhibitions(id) ON DELETE CASCADE,
      position integer NOT NULL,
      name text NOT NULL,
      place text,
      opens_on date NOT NULL,
      closes_on date NOT NULL,
      CHECK (closes_on >= opens_on),
      UNIQUE (exhibition_id, position) DEFERRABLE INITIALLY DEFERRED
    );

    CREATE TABLE exhibition_objects (
      exhibition_id uuid NOT NULL REFERENCES exhibitions(id) ON DELETE CASCADE,
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE RESTRICT,
      approval text NOT NULL DEFAULT 'pending' CHECK (approval IN ('pending','approved','refused')),
      reason text,
      approved_by uuid REFERENCES users(id),
      approved_at timestamptz,
      added_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (exhibition_id, print_id)
    );
    CREATE INDEX exhibition_objects_print_idx ON exhibition_objects (print_id);

    CREATE TABLE display_periods (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL,
      exhibition_id uuid NOT NULL,
      venue_id uuid REFERENCES exhibition_venues(id) ON DELETE RESTRICT,
      starts_on date NOT NULL,
      ends_on date NOT NULL,
      lux numeric NOT NULL CHECK (lux >= 0),
      hours_per_day numeric NOT NULL CHECK (hours_per_day > 0 AND hours_per_day <= 24),
      days_open smallint[] NOT NULL DEFAULT '{1,2,3,4,5,6,7}',
      closed_dates date[] NOT NULL DEFAULT '{}',
      uv numeric CHECK (uv >= 0),
      case_or_frame text,
      mount_notes text,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (ends_on >= starts_on),
      FOREIGN KEY (exhibition_id, print_id) REFERENCES exhibition_objects(exhibition_id, print_id) ON DELETE CASCADE,
      CONSTRAINT display_periods_no_overlap EXCLUDE USING gist (print_id WITH =, daterange(starts_on, ends_on, '[]') WITH &&)
    );
    CREATE INDEX display_periods_exhibition_idx ON display_periods (exhibition_id);

    ALTER TABLE prints
      ADD COLUMN light_responsivity_override text CHECK (light_responsivity_override IN ('irresponsive','low','medium','high')),
      ADD COLUMN light_override_reason text,
      ADD COLUMN light_override_by uuid REFERENCES users(id),
      ADD COLUMN light_override_at timestamptz,
      ADD COLUMN over_light_budget boolean NOT NULL DEFAULT false;
  `);

  // Entered categories become overrides where they differ from the default under the light settings'
  // default rules (light-budget.ts DEFAULT_RESPONSIVITY_RULES: the most responsive of the process's
  // category and each toner class's); then every print gets its effective category.
  await qi.sequelize.query(`
    CREATE TEMP TABLE light_default ON COMMIT DROP AS
    SELECT p.id,
      (SELECT c FROM unnest(ARRAY[
          CASE p.process
            WHEN 'gelatin_silver_developing_out' THEN 'medium' WHEN 'gelatin_silver_printing_out' THEN 'high'
            WHEN 'cyanotype' THEN 'high' WHEN 'albumen' THEN 'high' WHEN 'platinum_palladium' THEN 'low' ELSE 'medium' END
        ] || ARRAY(SELECT CASE t WHEN 'iron_blue' THEN 'high' WHEN 'copper' THEN 'medium' WHEN 'vanadium' THEN 'medium'
                                 WHEN 'other' THEN 'medium' END
                   FROM unnest(p.toner_classes) t)) c
       WHERE c IS NOT NULL
       ORDER BY array_position(ARRAY['irresponsive','low','medium','high'], c) DESC LIMIT 1) AS def
    FROM prints p;

    UPDATE prints p SET
      light_responsivity_override = p.light_responsivity,
      light_override_reason = 'Entered in the catalogue record before categories came from process and toner',
      light_override_at = now()
    FROM light_default d WHERE d.id = p.id AND p.light_responsivity IS NOT NULL AND d.def IS DISTINCT FROM p.light_responsivity;

    UPDATE prints p SET light_responsivity = coalesce(p.light_responsivity_override, d.def)
    FROM light_default d WHERE d.id = p.id AND p.light_responsivity IS DISTINCT FROM coalesce(p.light_responsivity_override, d.def);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    UPDATE prints SET light_responsivity = coalesce(light_responsivity_override, light_responsivity);
    ALTER TABLE prints DROP COLUMN light_responsivity_override, DROP COLUMN light_override_reason, DROP COLUMN light_override_by,
      DROP COLUMN light_override_at, DROP COLUMN over_light_budget;
    DROP TABLE display_periods;
    DROP TABLE exhibition_objects;
    DROP TABLE exhibition_venues;
    DROP TABLE exhibitions;
  `);
}
