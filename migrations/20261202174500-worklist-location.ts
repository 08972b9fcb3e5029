import type { QueryInterface } from 'sequelize';

/**
 * The work list filtered by place reads schedule rows by their print's place. Joining 200,000 prints to
 * their schedules for a room's counts cost 150–250 ms; with the place kept on the schedule row the counts
 * and the page are index-only scans of `(location_id, due_on, print_id)`.
 *
 * `print_schedules.location_id` is the print's place, kept by the database alone: set when a schedule
 * row is inserted (the risk model's upsert included) and changed when a print moves. Nobody writes it.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE print_schedules ADD COLUMN location_id uuid;
    UPDATE print_schedules s SET location_id = p.location_id FROM prints p WHERE p.id = s.print_id AND p.location_id IS NOT NULL;
    CREATE INDEX print_schedules_location_due_idx ON print_schedules (location_id, due_on, print_id);

    CREATE FUNCTION print_schedules_set_location() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      SELECT p.location_id INTO NEW.location_id FROM prints p WHERE p.id = NEW.print_id;
      RETURN NEW;
    END $$;
    CREATE TRIGGER print_schedules_set_location BEFORE INSERT ON print_schedules
      FOR EACH ROW EXECUTE FUNCTION print_schedules_set_location();

    CREATE FUNCTION prints_move_schedule() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      UPDATE print_schedules SET location_id = NEW.location_id WHERE print_id = NEW.id;
      RETURN NULL;
    END $$;
    CREATE TRIGGER prints_move_schedule AFTER UPDATE OF location_id ON prints
      FOR EACH ROW WHEN (OLD.location_id IS DISTINCT FROM NEW.location_id) EXECUTE FUNCTION prints_move_schedule();
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TRIGGER IF EXISTS prints_move_schedule ON prints;
    DROP FUNCTION IF EXISTS prints_move_schedule();
    DROP TRIGGER IF EXISTS print_schedules_set_location ON print_schedules;
    DROP FUNCTION IF EXISTS print_schedules_set_location();
    ALTER TABLE print_schedules DROP COLUMN IF EXISTS location_id;
  `);
}
