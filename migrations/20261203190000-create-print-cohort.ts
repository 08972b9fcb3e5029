import type { QueryInterface } from 'sequelize';

/**
 * `print_cohort`: one flat, narrow row per print holding every cohort factor already derived and the
 * outcomes a cohort query reads, so the cohort statement (`services/cohort-sql.ts`) reads this table
 * alone instead of joining prints, papers, enclosure types, display periods, the step factors and the
 * outcomes and deriving the factors per print at query time.
 *
 * Every row is written by one function, `print_cohort_refresh(ids)`, from the general derivation
 * (the expressions the cohort statement used to run: flags as 'yes'/'no'/'unknown', the light band
 * from the budget flag and the display periods, the year made, the terms' keys). Statement triggers
 * with transition tables call it in the very transaction that changes a source, whoever writes it:
 *
 * - `prints`: insert, and an update that changes a column a factor reads (a print's delete cascades);
 * - `papers` and `enclosure_types`: an update of a column a factor reads refreshes their prints;
 * - `display_periods`: insert, update, delete (the light band);
 * - `print_step_factors` (itself kept by the triggers on `process_steps`): insert, update, delete;
 * - `print_outcomes` (kept by the schedule's batches): insert, update, delete.
 *
 * The de_dates/de_values arrays and `term_first` stay in `print_outcomes` only: a query at a threshold
 * other than the stored one, or about one term, reads them there.
 */
const REFRESH = `
  CREATE FUNCTION print_cohort_refresh(ids uuid[]) RETURNS void LANGUAGE sql AS $$
    DELETE FROM print_cohort c WHERE c.print_id = ANY (ids) AND NOT EXISTS (SELECT 1 FROM prints p WHERE p.id = c.print_id);
    INSERT INTO print_cohort (print_id, accession_number, process, support, paper_base, paper_surface, paper_tint, toner_classes, toner_class,
        toned, toner_sequence, toning_min, toning_extent, wash_min, hypo_clearing, alkaline_after_bath, enclosure_type, enclosure_buffered,
        location_id, light_band, date_earliest, date_latest, date_made, maker, ferricyanide_gl, acid_gl, climate_permanence,
        de_per_year, density_loss_per_year, first_exam_on, last_report_on, last_measured_on, noticeable_on, noticeable_threshold,
        good_on, fair_on, poor_on, unacceptable_on, terms, has_outcomes, computed_at)
    SELECT p.id, p.accession_number, p.process, p.support, pa.base, pa.surface, pa.base_tint, p.toner_classes, p.toner_classes[1],
           CASE WHEN st.toned THEN 'yes' WHEN st.n > 0 THEN 'no' ELSE 'unknown' END,
           st.seq, st.toning_min, st.extent, st.wash_min,
           CASE WHEN st.hypo THEN 'yes' WHEN st.n > 0 THEN 'no' ELSE 'unknown' END,
           CASE WHEN st.alk_yes THEN 'yes' WHEN st.n > 0 AND NOT st.alk_unknown THEN 'no' ELSE 'unknown' END,
           et.name,
           CASE WHEN et.alkaline_buffered THEN 'yes' WHEN et.alkaline_buffered = false THEN 'no' ELSE 'unknown' END,
           p.location_id,
           CASE WHEN p.over_light_budget THEN 'over' WHEN EXISTS (SELECT 1 FROM display_periods d WHERE d.print_id = p.id) THEN 'within' ELSE 'none' END,
           p.date_earliest, p.date_latest, extract(year FROM p.date_earliest)::float8, p.maker_name,
           o.ferricyanide_gl, o.acid_gl, o.climate_permanence,
           o.de_per_year, o.density_loss_per_year, o.first_exam_on, o.last_report_on, o.last_measured_on, o.noticeable_on, o.noticeable_threshold,
           o.good_on, o.fair_on, o.poor_on, o.unacceptable_on,
           coalesce(o.terms, CASE WHEN o.term_first <> '{}'::jsonb THEN ARRAY(SELECT jsonb_object_keys(o.term_first)) END),
           o.print_id IS NOT NULL, o.computed_at
      FROM prints p
      LEFT JOIN papers pa ON pa.id = p.paper_id
      LEFT JOIN enclosure_types et ON et.id = p.enclosure_id
      LEFT JOIN print_step_factors st ON st.print_id = p.id
      LEFT JOIN print_outcomes o ON o.print_id = p.id
     WHERE p.id = ANY (ids)
    ON CONFLICT (print_id) DO UPDATE SET accession_number = EXCLUDED.accession_number, process = EXCLUDED.process, support = EXCLUDED.support,
      paper_base = EXCLUDED.paper_base, paper_surface = EXCLUDED.paper_surface, paper_tint = EXCLUDED.paper_tint, toner_classes = EXCLUDED.toner_classes,
      toner_class = EXCLUDED.toner_class, toned = EXCLUDED.toned, toner_sequence = EXCLUDED.toner_sequence, toning_min = EXCLUDED.toning_min,
      toning_extent = EXCLUDED.toning_extent, wash_min = EXCLUDED.wash_min, hypo_clearing = EXCLUDED.hypo_clearing,
      alkaline_after_bath = EXCLUDED.alkaline_after_bath, enclosure_type = EXCLUDED.enclosure_type, enclosure_buffered = EXCLUDED.enclosure_buffered,
      location_id = EXCLUDED.location_id, light_band = EXCLUDED.light_band, date_earliest = EXCLUDED.date_earliest, date_latest = EXCLUDED.date_latest,
      date_made = EXCLUDED.date_made, maker = EXCLUDED.maker, ferricyanide_gl = EXCLUDED.ferricyanide_gl, acid_gl = EXCLUDED.acid_gl,
      climate_permanence = EXCLUDED.climate_permanence, de_per_year = EXCLUDED.de_per_year, density_loss_per_year = EXCLUDED.density_loss_per_year,
      first_exam_on = EXCLUDED.first_exam_on, last_report_on = EXCLUDED.last_report_on, last_measured_on = EXCLUDED.last_measured_on,
      noticeable_on = EXCLUDED.noticeable_on, noticeable_threshold = EXCLUDED.noticeable_threshold, good_on = EXCLUDED.good_on,
      fair_on = EXCLUDED.fair_on, poor_on = EXCLUDED.poor_on, unacceptable_on = EXCLUDED.unacceptable_on, terms = EXCLUDED.terms,
      has_outcomes = EXCLUDED.has_outcomes, computed_at = EXCLUDED.computed_at;
  $$;
`;

/** The columns of `prints` a factor reads: an update changing none of them leaves the row as it is. */
const PRINT_COLUMNS = 'accession_number, process, support, paper_id, toner_classes, enclosure_id, location_id, over_light_budget, date_earliest, date_latest, maker_name';

/** A trigger function refreshing the print ids the statement's transition tables name. */
const fn = (name: string, ids: string) => `
  CREATE FUNCTION ${name}() RETURNS trigger LANGUAGE plpgsql AS $$
  BEGIN
    PERFORM print_cohort_refresh(ARRAY(${ids}));
    RETURN NULL;
  END $$;`;

const TRIGGERS = `
  ${fn('print_cohort_prints_inserted', 'SELECT id FROM new_rows')}
  ${fn('print_cohort_prints_updated', `SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
     WHERE (n.${PRINT_COLUMNS.split(', ').join(', n.')}) IS DISTINCT FROM (o.${PRINT_COLUMNS.split(', ').join(', o.')})`)}
  ${fn('print_cohort_papers_updated', `SELECT p.id FROM prints p WHERE p.paper_id IN (SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
     WHERE (n.base, n.surface, n.base_tint) IS DISTINCT FROM (o.base, o.surface, o.base_tint))`)}
  ${fn('print_cohort_enclosures_updated', `SELECT p.id FROM prints p WHERE p.enclosure_id IN (SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
     WHERE (n.name, n.alkaline_buffered) IS DISTINCT FROM (o.name, o.alkaline_buffered))`)}
  ${fn('print_cohort_by_print_new', 'SELECT DISTINCT print_id FROM new_rows')}
  ${fn('print_cohort_by_print_old', 'SELECT DISTINCT print_id FROM old_rows')}
  ${fn('print_cohort_by_print_both', 'SELECT print_id FROM new_rows UNION SELECT print_id FROM old_rows')}

  CREATE TRIGGER print_cohort_insert AFTER INSERT ON prints REFERENCING NEW TABLE AS new_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_prints_inserted();
  CREATE TRIGGER print_cohort_update AFTER UPDATE ON prints REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_prints_updated();
  CREATE TRIGGER print_cohort_update AFTER UPDATE ON papers REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_papers_updated();
  CREATE TRIGGER print_cohort_update AFTER UPDATE ON enclosure_types REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_enclosures_updated();
  ${['display_periods', 'print_step_factors', 'print_outcomes'].map((table) => `
  CREATE TRIGGER print_cohort_insert AFTER INSERT ON ${table} REFERENCING NEW TABLE AS new_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_by_print_new();
  CREATE TRIGGER print_cohort_update AFTER UPDATE ON ${table} REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_by_print_both();
  CREATE TRIGGER print_cohort_delete AFTER DELETE ON ${table} REFERENCING OLD TABLE AS old_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_by_print_old();`).join('\n')}
`;

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE print_cohort (
      print_id uuid PRIMARY KEY REFERENCES prints(id) ON DELETE CASCADE,
      accession_number text NOT NULL,
      process text NOT NULL,
      support text,
      paper_base text,
      paper_surface text,
      paper_tint text,
      toner_classes text[],
      toner_class text,
      toned text NOT NULL,
      toner_sequence text,
      toning_min double precision,
      toning_extent text,
      wash_min double precision,
      hypo_clearing text NOT NULL,
      alkaline_after_bath text NOT NULL,
      enclosure_type text,
      enclosure_buffered text NOT NULL,
      location_id uuid,
      light_band text NOT NULL,
      date_earliest date,
      date_latest date,
      date_made double precision,
      maker text,
      ferricyanide_gl double precision,
      acid_gl double precision,
      climate_permanence double precision,
      de_per_year double precision,
      density_loss_per_year double precision,
      first_exam_on date,
      last_report_on date,
      last_measured_on date,
      noticeable_on date,
      noticeable_threshold double precision,
      good_on date,
      fair_on date,
      poor_on date,
      unacceptable_on date,
      terms text[],
      has_outcomes boolean NOT NULL,
      computed_at timestamptz
    );
    ${REFRESH}
    ${TRIGGERS}
    SELECT print_cohort_refresh(ARRAY(SELECT id FROM prints));
    ANALYZE print_cohort;
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TRIGGER print_cohort_insert ON prints;
    DROP TRIGGER print_cohort_update ON prints;
    DROP TRIGGER print_cohort_update ON papers;
    DROP TRIGGER print_cohort_update ON enclosure_types;
    ${['display_periods', 'print_step_factors', 'print_outcomes'].map((table) => `
    DROP TRIGGER print_cohort_insert ON ${table};
    DROP TRIGGER print_cohort_update ON ${table};
    DROP TRIGGER print_cohort_delete ON ${table};`).join('\n')}
    DROP FUNCTION print_cohort_prints_inserted(), print_cohort_prints_updated(), print_cohort_papers_updated(), print_cohort_enclosures_updated(),
      print_cohort_by_print_new(), print_cohort_by_print_old(), print_cohort_by_print_both();
    DROP FUNCTION print_cohort_refresh(uuid[]);
    DROP TABLE print_cohort;
  `);
}
