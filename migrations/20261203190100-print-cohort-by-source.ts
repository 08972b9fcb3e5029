import type { QueryInterface } from 'sequelize';

/**
 * Each source of `print_cohort` writes only its own columns. With one function rewriting the whole
 * row, two transactions changing different sources of one print (the schedule's outcomes and an
 * edit of the print's process steps, say) could each compute the row from its own snapshot, and
 * the one waiting for the other's row lock would then write back the other's columns as they were
 * before it committed. Now the outcomes' triggers set the outcome columns, the steps' the step
 * factors, the display periods' the light band, a paper's or an enclosure type's update their own
 * columns, and a print's update the columns read from the print (with its paper, enclosure type and
 * light band); a print's insert still writes the whole row (`print_cohort_refresh`).
 */
const part = (name: string, set: string, from: string) => `
  CREATE FUNCTION ${name}(ids uuid[]) RETURNS void LANGUAGE sql AS $$
    UPDATE print_cohort c SET ${set}
      FROM ${from}
     WHERE c.print_id = x.id;
  $$;`;

const OUTCOMES = part('print_cohort_set_outcomes', `ferricyanide_gl = o.ferricyanide_gl, acid_gl = o.acid_gl, climate_permanence = o.climate_permanence,
      de_per_year = o.de_per_year, density_loss_per_year = o.density_loss_per_year, first_exam_on = o.first_exam_on, last_report_on = o.last_report_on,
      last_measured_on = o.last_measured_on, noticeable_on = o.noticeable_on, noticeable_threshold = o.noticeable_threshold, good_on = o.good_on,
      fair_on = o.fair_on, poor_on = o.poor_on, unacceptable_on = o.unacceptable_on,
      terms = coalesce(o.terms, CASE WHEN o.term_first <> '{}'::jsonb THEN ARRAY(SELECT jsonb_object_keys(o.term_first)) END),
      has_outcomes = o.print_id IS NOT NULL, computed_at = o.computed_at`,
'unnest(ids) AS x(id) LEFT JOIN print_outcomes o ON o.print_id = x.id');

const STEPS = part('print_cohort_set_steps', `toned = CASE WHEN st.toned THEN 'yes' WHEN st.n > 0 THEN 'no' ELSE 'unknown' END,
      toner_sequence = st.seq, toning_min = st.toning_min, toning_extent = st.extent, wash_min = st.wash_min,
      hypo_clearing = CASE WHEN st.hypo THEN 'yes' WHEN st.n > 0 THEN 'no' ELSE 'unknown' END,
      alkaline_after_bath = CASE WHEN st.alk_yes THEN 'yes' WHEN st.n > 0 AND NOT st.alk_unknown THEN 'no' ELSE 'unknown' END`,
'unnest(ids) AS x(id) LEFT JOIN print_step_factors st ON st.print_id = x.id');

const LIGHT_BAND = `CASE WHEN p.over_light_budget THEN 'over' WHEN EXISTS (SELECT 1 FROM display_periods d WHERE d.print_id = p.id) THEN 'within' ELSE 'none' END`;
const LIGHT = part('print_cohort_set_light', `light_band = ${LIGHT_BAND}`, 'unnest(ids) AS x(id) JOIN prints p ON p.id = x.id');

const PAPER_SET = 'paper_base = pa.base, paper_surface = pa.surface, paper_tint = pa.base_tint';
const ENCLOSURE_SET = `enclosure_type = et.name,
      enclosure_buffered = CASE WHEN et.alkaline_buffered THEN 'yes' WHEN et.alkaline_buffered = false THEN 'no' ELSE 'unknown' END`;
const PAPER = part('print_cohort_set_paper', PAPER_SET, 'unnest(ids) AS x(id) JOIN prints p ON p.id = x.id LEFT JOIN papers pa ON pa.id = p.paper_id');
const ENCLOSURE = part('print_cohort_set_enclosure', ENCLOSURE_SET, 'unnest(ids) AS x(id) JOIN prints p ON p.id = x.id LEFT JOIN enclosure_types et ON et.id = p.enclosure_id');
const PRINT = part('print_cohort_set_print', `accession_number = p.accession_number, process = p.process, support = p.support, ${PAPER_SET},
      toner_classes = p.toner_classes, toner_class = p.toner_classes[1], ${ENCLOSURE_SET}, location_id = p.location_id,
      light_band = ${LIGHT_BAND}, date_earliest = p.date_earliest, date_latest = p.date_latest,
      date_made = extract(year FROM p.date_earliest)::float8, maker = p.maker_name`,
'unnest(ids) AS x(id) JOIN prints p ON p.id = x.id LEFT JOIN papers pa ON pa.id = p.paper_id LEFT JOIN enclosure_types et ON et.id = p.enclosure_id');

const PRINT_COLUMNS = 'accession_number, process, support, paper_id, toner_classes, enclosure_id, location_id, over_light_budget, date_earliest, date_latest, maker_name';

/** A trigger function calling `fn` with the print ids the statement's transition tables name. */
const trigger = (name: string, fn: string, ids: string) => `
  CREATE OR REPLACE FUNCTION ${name}() RETURNS trigger LANGUAGE plpgsql AS $$
  BEGIN
    PERFORM ${fn}(ARRAY(${ids}));
    RETURN NULL;
  END $$;`;

const BY_SOURCE = (table: string, fn: string) => `
  ${trigger(`print_cohort_${table}_new`, fn, 'SELECT DISTINCT print_id FROM new_rows')}
  ${trigger(`print_cohort_${table}_old`, fn, 'SELECT DISTINCT print_id FROM old_rows')}
  ${trigger(`print_cohort_${table}_both`, fn, 'SELECT print_id FROM new_rows UNION SELECT print_id FROM old_rows')}
  DROP TRIGGER print_cohort_insert ON ${table};
  DROP TRIGGER print_cohort_update ON ${table};
  DROP TRIGGER print_cohort_delete ON ${table};
  CREATE TRIGGER print_cohort_insert AFTER INSERT ON ${table} REFERENCING NEW TABLE AS new_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_${table}_new();
  CREATE TRIGGER print_cohort_update AFTER UPDATE ON ${table} REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_${table}_both();
  CREATE TRIGGER print_cohort_delete AFTER DELETE ON ${table} REFERENCING OLD TABLE AS old_rows
    FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_${table}_old();`;

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ${OUTCOMES}
    ${STEPS}
    ${LIGHT}
    ${PAPER}
    ${ENCLOSURE}
    ${PRINT}
    ${BY_SOURCE('print_outcomes', 'print_cohort_set_outcomes')}
    ${BY_SOURCE('print_step_factors', 'print_cohort_set_steps')}
    ${BY_SOURCE('display_periods', 'print_cohort_set_light')}
    ${trigger('print_cohort_prints_updated', 'print_cohort_set_print', `SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
       WHERE (n.${PRINT_COLUMNS.split(', ').join(', n.')}) IS DISTINCT FROM (o.${PRINT_COLUMNS.split(', ').join(', o.')})`)}
    ${trigger('print_cohort_papers_updated', 'print_cohort_set_paper', `SELECT p.id FROM prints p WHERE p.paper_id IN (SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
       WHERE (n.base, n.surface, n.base_tint) IS DISTINCT FROM (o.base, o.surface, o.base_tint))`)}
    ${trigger('print_cohort_enclosures_updated', 'print_cohort_set_enclosure', `SELECT p.id FROM prints p WHERE p.enclosure_id IN (SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
       WHERE (n.name, n.alkaline_buffered) IS DISTINCT FROM (o.name, o.alkaline_buffered))`)}
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  const restore = (table: string) => `
    DROP TRIGGER print_cohort_insert ON ${table};
    DROP TRIGGER print_cohort_update ON ${table};
    DROP TRIGGER print_cohort_delete ON ${table};
    CREATE TRIGGER print_cohort_insert AFTER INSERT ON ${table} REFERENCING NEW TABLE AS new_rows
      FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_by_print_new();
    CREATE TRIGGER print_cohort_update AFTER UPDATE ON ${table} REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
      FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_by_print_both();
    CREATE TRIGGER print_cohort_delete AFTER DELETE ON ${table} REFERENCING OLD TABLE AS old_rows
      FOR EACH STATEMENT EXECUTE FUNCTION print_cohort_by_print_old();
    DROP FUNCTION print_cohort_${table}_new(), print_cohort_${table}_old(), print_cohort_${table}_both();`;
  await qi.sequelize.query(`
    ${restore('print_outcomes')}
    ${restore('print_step_factors')}
    ${restore('display_periods')}
    ${trigger('print_cohort_prints_updated', 'print_cohort_refresh', `SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
       WHERE (n.${PRINT_COLUMNS.split(', ').join(', n.')}) IS DISTINCT FROM (o.${PRINT_COLUMNS.split(', ').join(', o.')})`)}
    ${trigger('print_cohort_papers_updated', 'print_cohort_refresh', `SELECT p.id FROM prints p WHERE p.paper_id IN (SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
       WHERE (n.base, n.surface, n.base_tint) IS DISTINCT FROM (o.base, o.surface, o.base_tint))`)}
    ${trigger('print_cohort_enclosures_updated', 'print_cohort_refresh', `SELECT p.id FROM prints p WHERE p.enclosure_id IN (SELECT n.id FROM new_rows n JOIN old_rows o ON o.id = n.id
       WHERE (n.name, n.alkaline_buffered) IS DISTINCT FROM (o.name, o.alkaline_buffered))`)}
    DROP FUNCTION print_cohort_set_outcomes(uuid[]), print_cohort_set_steps(uuid[]), print_cohort_set_light(uuid[]),
      print_cohort_set_paper(uuid[]), print_cohort_set_enclosure(uuid[]), print_cohort_set_print(uuid[]);
  `);
}
