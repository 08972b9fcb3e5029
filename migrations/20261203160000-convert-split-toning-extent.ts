import type { QueryInterface } from 'sequelize';

/**
 * A toning step's extent is how far the toning went: full, partial or local. A split effect (two
 * tones, shadows and highlights) is not an extent: steps recorded as 'split' become 'partial' with
 * "Split effect." at the head of their notes, so nothing recorded is lost.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    UPDATE process_steps
       SET extent = 'partial',
           notes = CASE WHEN notes IS NULL OR btrim(notes) = '' THEN 'Split effect.' ELSE 'Split effect. ' || notes END
     WHERE extent = 'split';
    ALTER TABLE process_steps DROP CONSTRAINT IF EXISTS process_steps_extent_check;
    ALTER TABLE process_steps ADD CONSTRAINT process_steps_extent_check CHECK (extent IN ('full','partial','local'));
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE process_steps DROP CONSTRAINT IF EXISTS process_steps_extent_check;
    ALTER TABLE process_steps ADD CONSTRAINT process_steps_extent_check CHECK (extent IN ('full','partial','split','local'));
    UPDATE process_steps SET extent = 'split', notes = NULLIF(regexp_replace(notes, '^Split effect\\.\\s?', ''), '')
     WHERE extent = 'partial' AND notes LIKE 'Split effect.%';
  `);
}
