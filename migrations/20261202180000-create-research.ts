import type { QueryInterface } from 'sequelize';

/**
 * Longevity research.
 *
 * - `research_queries`: saved cohort queries (the query as the contract's jsonb), private to their
 *   owner unless shared; version-checked edits.
 * - `print_outcomes`: one row per print, what a cohort query needs without refitting anything at query
 *   time, written by `services/print-outcomes.ts` beside the re-inspection schedule (the same stale
 *   marks, the same batches, the full recompute). The fading series of the print's maximum-density
 *   spot is kept as two arrays (the dates and ΔE00 of the fitted points), so a threshold other than
 *   the settings' one is answered in SQL: the first date whose ΔE00 reaches it.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE research_queries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      description text CHECK (length(description) <= 4000),
      query jsonb NOT NULL,
      shared boolean NOT NULL DEFAULT false,
      owner_id uuid NOT NULL REFERENCES users(id),
      owner_name text NOT NULL,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX research_queries_owner_idx ON research_queries (owner_id, updated_at DESC);
    CREATE INDEX research_queries_shared_idx ON research_queries (updated_at DESC) WHERE shared;

    CREATE TABLE print_outcomes (
      print_id uuid PRIMARY KEY REFERENCES prints(id) ON DELETE CASCADE,
      -- The maximum-density spot: purpose dmax, else the spot with the highest baseline density.
      spot_id uuid,
      baseline_on date,
      -- Fitted rates (spot-analysis.ts): ΔE00 per year, density lost in % of the baseline density per year.
      de_per_year double precision,
      density_loss_per_year double precision,
      -- The fitted points of that spot, oldest first: the day measured and ΔE00 against the baseline.
      de_dates date[] NOT NULL DEFAULT '{}',
      de_values double precision[] NOT NULL DEFAULT '{}',
      -- The first day ΔE00 reached the measurement settings' noticeable threshold (as of computed_at).
      noticeable_on date,
      -- Examinations: measurement sessions and signed condition reports.
      first_exam_on date,
      last_exam_on date,
      last_report_on date,
      last_measured_on date,
      -- { term_code: first signed report date showing it }.
      term_first jsonb NOT NULL DEFAULT '{}',
      -- The first signed report graded at or below each grade.
      good_on date, fair_on date, poor_on date, unacceptable_on date,
      -- Factors computed in the application: toner chemistry from the recipes and dilution, the store's permanence.
      ferricyanide_gl double precision,
      acid_gl double precision,
      climate_permanence double precision,
      computed_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX print_outcomes_terms_idx ON print_outcomes USING gin (term_first);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE IF EXISTS print_outcomes; DROP TABLE IF EXISTS research_queries;');
}
