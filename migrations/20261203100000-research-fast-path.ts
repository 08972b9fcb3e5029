import type { QueryInterface } from 'sequelize';

/**
 * What lets a cohort query read stored values instead of aggregating at query time.
 *
 * - `print_step_factors`: per print with process steps, the aggregates over them that the cohort
 *   factors read (how many steps, toned, the toner sequence, toning time and extent, washing time,
 *   hypo clearing, the after-baths' alkalinity). Kept by statement triggers on `process_steps`
 *   (insert, update, delete, with their transition tables), so it is current in the very transaction
 *   that changes the steps, whoever writes them (the API, the import, the seeds, a test's INSERT).
 *   A print without steps has no row. The expressions are those the cohort statement used to run
 *   over `process_steps` (`cohort-sql.ts`).
 * - `print_outcomes.noticeable_threshold`: the ΔE00 threshold `noticeable_on` was computed with, so a
 *   query with that threshold reads the stored day instead of searching the fitted points.
 * - `print_outcomes.terms`: the keys of `term_first` (in `jsonb_object_keys` order), so counting the
 *   terms does not unpack the jsonb of every print.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE print_step_factors (
      print_id uuid PRIMARY KEY REFERENCES prints(id) ON DELETE CASCADE,
      n integer NOT NULL,
      toned boolean NOT NULL,
      seq text,
      toning_min double precision,
      extent text,
      wash_min double precision,
      hypo boolean NOT NULL,
      alk_yes boolean NOT NULL,
      alk_unknown boolean NOT NULL
    );

    CREATE FUNCTION print_step_factors_refresh(ids uuid[]) RETURNS void LANGUAGE sql AS $$
      DELETE FROM print_step_factors f WHERE f.print_id = ANY (ids) AND NOT EXISTS (SELECT 1 FROM process_steps s WHERE s.print_id = f.print_id);
      INSERT INTO print_step_factors (print_id, n, toned, seq, toning_min, extent, wash_min, hypo, alk_yes, alk_unknown)
      SELECT s.print_id, count(*),
             coalesce(bool_or(s.type = 'toning'), false),
             string_agg(s.toner_class, ' → ' ORDER BY s.position) FILTER (WHERE s.type = 'toning'),
             (sum(s.time_seconds) FILTER (WHERE s.type = 'toning') / 60.0)::float8,
             (array_agg(s.extent ORDER BY s.position) FILTER (WHERE s.type = 'toning'))[1],
             (sum(s.time_seconds) FILTER (WHERE s.type IN ('washing','final_wash')) / 60.0)::float8,
             coalesce(bool_or(s.type = 'hypo_clearing'), false),
             coalesce(bool_or(s.alkaline) FILTER (WHERE s.type = 'after_bath'), false),
             coalesce(bool_or(s.alkaline IS NULL) FILTER (WHERE s.type = 'after_bath'), false)
        FROM process_steps s
       WHERE s.print_id = ANY (ids)
       GROUP BY s.print_id
      ON CONFLICT (print_id) DO UPDATE SET n = EXCLUDED.n, toned = EXCLUDED.toned, seq = EXCLUDED.seq, toning_min = EXCLUDED.toning_min,
        extent = EXCLUDED.extent, wash_min = EXCLUDED.wash_min, hypo = EXCLUDED.hypo, alk_yes = EXCLUDED.alk_yes, alk_unknown = EXCLUDED.alk_unknown;
    $$;

    CREATE FUNCTION process_steps_refresh_inserted() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM print_step_factors_refresh(ARRAY(SELECT DISTINCT print_id FROM new_rows));
      RETURN NULL;
    END $$;
    CREATE FUNCTION process_steps_refresh_updated() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM print_step_factors_refresh(ARRAY(SELECT print_id FROM new_rows UNION SELECT print_id FROM old_rows));
      RETURN NULL;
    END $$;
    CREATE FUNCTION process_steps_refresh_deleted() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM print_step_factors_refresh(ARRAY(SELECT DISTINCT print_id FROM old_rows));
      RETURN NULL;
    END $$;
    CREATE TRIGGER process_steps_factors_insert AFTER INSERT ON process_steps REFERENCING NEW TABLE AS new_rows
      FOR EACH STATEMENT EXECUTE FUNCTION process_steps_refresh_inserted();
    CREATE TRIGGER process_steps_factors_update AFTER UPDATE ON process_steps REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
      FOR EACH STATEMENT EXECUTE FUNCTION process_steps_refresh_updated();
    CREATE TRIGGER process_steps_factors_delete AFTER DELETE ON process_steps REFERENCING OLD TABLE AS old_rows
      FOR EACH STATEMENT EXECUTE FUNCTION process_steps_refresh_deleted();

    SELECT print_step_factors_refresh(ARRAY(SELECT DISTINCT print_id FROM process_steps));

    ALTER TABLE print_outcomes ADD COLUMN noticeable_threshold double precision, ADD COLUMN terms text[];
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE print_outcomes DROP COLUMN noticeable_threshold, DROP COLUMN terms;
    DROP TRIGGER process_steps_factors_insert ON process_steps;
    DROP TRIGGER process_steps_factors_update ON process_steps;
    DROP TRIGGER process_steps_factors_delete ON process_steps;
    DROP FUNCTION process_steps_refresh_inserted(), process_steps_refresh_updated(), process_steps_refresh_deleted();
    DROP FUNCTION print_step_factors_refresh(uuid[]);
    DROP TABLE print_step_factors;
  `);
}
