import type { QueryInterface } from 'sequelize';

/**
 * The catalogue: makers, papers, bath recipes, locations, enclosure types, prints, process steps,
 * movements, settings and CSV imports. Controlled values are CHECK constraints, so nothing outside
 * the vocabularies in common/src/schemas/vocab.ts can be stored by any path.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE settings (
      key text PRIMARY KEY,
      value jsonb NOT NULL,
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE makers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      life_dates text,
      notes text,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX makers_name_key ON makers (lower(name));

    CREATE TABLE papers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      manufacturer text NOT NULL,
      product text NOT NULL,
      base text NOT NULL CHECK (base IN ('fibre','rc','other')),
      surface text,
      base_tint text,
      weight text,
      optical_brighteners text NOT NULL DEFAULT 'unknown' CHECK (optical_brighteners IN ('yes','no','unknown')),
      made_dates text,
      made_earliest date,
      made_latest date,
      notes text,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX papers_label_key ON papers (lower(manufacturer), lower(product), coalesce(lower(surface), ''));

    CREATE TABLE bath_recipes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      toner_class text CHECK (toner_class IN ('selenium','gold','sulfide','polysulfide','iron_blue','copper','vanadium','other')),
      volume_ml numeric NOT NULL CHECK (volume_ml > 0),
      ingredients jsonb NOT NULL,
      mixing_notes text,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX bath_recipes_name_key ON bath_recipes (lower(name));

    CREATE TABLE locations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      parent_id uuid REFERENCES locations(id) ON DELETE RESTRICT,
      name text NOT NULL,
      kind text NOT NULL CHECK (kind IN ('building','room','cabinet','shelf','drawer','box','other')),
      code text,
      notes text,
      path_label text NOT NULL,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX locations_sibling_name_key ON locations (coalesce(parent_id, '00000000-0000-0000-0000-000000000000'::uuid), lower(name));
    CREATE INDEX locations_parent_idx ON locations (parent_id);

    CREATE TABLE enclosure_types (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      material text,
      alkaline_buffered boolean,
      pat_result text NOT NULL DEFAULT 'not_tested' CHECK (pat_result IN ('passed','failed','not_tested')),
      notes text,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX enclosure_types_name_key ON enclosure_types (lower(name));

    CREATE TABLE prints (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      accession_number text NOT NULL,
      accession_sort text NOT NULL,
      title text NOT NULL,
      maker_id uuid REFERENCES makers(id) ON DELETE RESTRICT,
      maker_name text,
      date_made text,
      date_display text,
      date_earliest date,
      date_latest date,
      image_width_mm numeric, image_height_mm numeric,
      sheet_width_mm numeric, sheet_height_mm numeric,
      mount_width_mm numeric, mount_height_mm numeric,
      process text NOT NULL CHECK (process IN ('gelatin_silver_developing_out','gelatin_silver_printing_out','cyanotype','albumen','platinum_palladium','other')),
      support text CHECK (support IN ('fibre_baryta','resin_coated','other')),
      paper_id uuid REFERENCES papers(id) ON DELETE RESTRICT,
      paper_label text,
      inscriptions text,
      provenance text,
      credit_line text,
      status text NOT NULL DEFAULT 'in_store' CHECK (status IN ('in_store','on_display','on_loan','in_treatment','deaccessioned')),
      location_id uuid REFERENCES locations(id) ON DELETE RESTRICT,
      enclosure_id uuid REFERENCES enclosure_types(id) ON DELETE RESTRICT,
      light_responsivity text CHECK (light_responsivity IN ('irresponsive','low','medium','high')),
      staff_notes text,
      valuation_amount numeric,
      valuation_currency text,
      toner_classes text[] NOT NULL DEFAULT '{}',
      warning_codes text[] NOT NULL DEFAULT '{}',
      -- Full text over the public descriptive fields (|| and to_tsvector with a named configuration are immutable).
      search tsvector GENERATED ALWAYS AS (to_tsvector('simple',
        accession_number || ' ' || title || ' ' || coalesce(maker_name, '') || ' ' || coalesce(paper_label, '') || ' ' ||
        coalesce(inscriptions, '') || ' ' || coalesce(provenance, '') || ' ' || coalesce(credit_line, ''))) STORED,
      -- Staff notes are searched separately: roles that may not read them must not find by them.
      search_notes tsvector GENERATED ALWAYS AS (to_tsvector('simple', coalesce(staff_notes, ''))) STORED,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX prints_accession_number_key ON prints (lower(accession_number));

    CREATE TABLE process_steps (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE CASCADE,
      position integer NOT NULL,
      type text NOT NULL CHECK (type IN ('development','stop','fixing','washing','hypo_clearing','toning','after_bath','final_wash','residual_thiosulfate_test')),
      agent text,
      toner_class text CHECK (toner_class IN ('selenium','gold','sulfide','polysulfide','iron_blue','copper','vanadium','other')),
      recipe_id uuid REFERENCES bath_recipes(id) ON DELETE RESTRICT,
      dilution text,
      time_seconds integer,
      temperature_c numeric,
      extent text CHECK (extent IN ('full','partial','split','local')),
      concentration text,
      alkaline boolean,
      method text CHECK (method IN ('iso18917_methylene_blue','iso18917_silver_sulfide','iso18917_iodine_amylose','spot_test')),
      value numeric,
      unit text,
      notes text,
      UNIQUE (print_id, position)
    );
    CREATE INDEX process_steps_recipe_idx ON process_steps (recipe_id) WHERE recipe_id IS NOT NULL;

    CREATE TABLE movements (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE CASCADE,
      from_location_id uuid REFERENCES locations(id) ON DELETE RESTRICT,
      to_location_id uuid NOT NULL REFERENCES locations(id) ON DELETE RESTRICT,
      moved_at timestamptz NOT NULL DEFAULT now(),
      moved_by uuid REFERENCES users(id),
      moved_by_name text,
      reason text NOT NULL
    );
    CREATE INDEX movements_print_idx ON movements (print_id, moved_at DESC);

    CREATE TABLE imports (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      kind text NOT NULL DEFAULT 'prints',
      file_name text NOT NULL,
      source text NOT NULL,
      status text NOT NULL CHECK (status IN ('validating','ready','invalid','committing','committed','failed')),
      total_rows integer NOT NULL DEFAULT 0,
      processed_rows integer NOT NULL DEFAULT 0,
      error_count integer NOT NULL DEFAULT 0,
      errors jsonb NOT NULL DEFAULT '[]',
      new_makers jsonb NOT NULL DEFAULT '[]',
      created_prints integer NOT NULL DEFAULT 0,
      message text,
      created_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      finished_at timestamptz
    );
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TABLE imports; DROP TABLE movements; DROP TABLE process_steps; DROP TABLE prints;
    DROP TABLE enclosure_types; DROP TABLE locations; DROP TABLE bath_recipes; DROP TABLE papers;
    DROP TABLE makers; DROP TABLE settings;
  `);
}
