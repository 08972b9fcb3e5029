import type { QueryInterface } from 'sequelize';

/**
 * Storage climate and the re-inspection schedule.
 * - `climate_files`: a logger CSV as uploaded (its text kept until accepted or discarded), its mapping and check.
 * - `climate_readings`: the time series, one row per location and instant (a reading already held is kept).
 * - `print_schedules`: each print's computed next-inspection date, its factors, and a conservator's override.
 * - `schedule_stale`: prints whose date an input change has made stale, written in that change's transaction
 *   (so no change is missed if the server stops), emptied by the schedule job.
 * - `inspection_rounds` and their items: dated rounds of checks assigned to a person; an item is checked off
 *   by the condition report signed for it.
 * - `reminder_preferences`: each person's weekly digest (on/off, weekday) and calendar feed token (its SHA-256 only).
 * - `digest_sends`: one row per person and ISO week, unique, so a digest goes out once however many servers run.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE climate_files (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      location_id uuid NOT NULL REFERENCES locations(id) ON DELETE RESTRICT,
      file_name text NOT NULL,
      status text NOT NULL DEFAULT 'uploaded' CHECK (status IN ('uploaded','checked','accepted','discarded')),
      content text,
      row_count integer NOT NULL DEFAULT 0,
      mapping jsonb,
      check_result jsonb,
      accepted_rows integer,
      uploaded_by uuid NOT NULL REFERENCES users(id),
      uploaded_at timestamptz NOT NULL DEFAULT now(),
      accepted_at timestamptz
    );
    CREATE INDEX climate_files_location_idx ON climate_files (location_id, uploaded_at DESC);

    CREATE TABLE climate_readings (
      location_id uuid NOT NULL REFERENCES locations(id) ON DELETE RESTRICT,
      taken_at timestamptz NOT NULL,
      temperature_c real NOT NULL CHECK (temperature_c BETWEEN -60 AND 80),
      rh_percent real NOT NULL CHECK (rh_percent BETWEEN 0 AND 100),
      file_id uuid NOT NULL REFERENCES climate_files(id) ON DELETE RESTRICT,
      PRIMARY KEY (location_id, taken_at)
    );

    CREATE TABLE print_schedules (
      print_id uuid PRIMARY KEY REFERENCES prints(id) ON DELETE CASCADE,
      computed_due_on date NOT NULL,
      due_on date NOT NULL,
      interval_months numeric NOT NULL,
      risk text NOT NULL CHECK (risk IN ('low','moderate','high','urgent')),
      risk_rank smallint NOT NULL,
      factors jsonb NOT NULL DEFAULT '[]',
      reasons text[] NOT NULL DEFAULT '{}',
      main_reason text NOT NULL DEFAULT '',
      last_checked_on date,
      override_due_on date,
      override_reason text,
      overridden_by uuid REFERENCES users(id),
      overridden_at timestamptz,
      computed_at timestamptz NOT NULL DEFAULT now(),
      version integer NOT NULL DEFAULT 1
    );
    CREATE INDEX print_schedules_due_idx ON print_schedules (due_on, print_id);
    CREATE INDEX print_schedules_reasons_idx ON print_schedules USING gin (reasons);

    -- Prints whose date must be computed again (an input changed); written in the changing transaction, emptied by the schedule job.
    CREATE TABLE schedule_stale (
      print_id uuid PRIMARY KEY REFERENCES prints(id) ON DELETE CASCADE,
      since timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE inspection_rounds (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      title text NOT NULL,
      planned_on date NOT NULL,
      status text NOT NULL DEFAULT 'planned' CHECK (status IN ('planned','done','cancelled')),
      assignee_id uuid NOT NULL REFERENCES users(id),
      notes text,
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      version integer NOT NULL DEFAULT 1
    );
    CREATE INDEX inspection_rounds_planned_idx ON inspection_rounds (planned_on, id);
    CREATE INDEX inspection_rounds_assignee_idx ON inspection_rounds (assignee_id, planned_on);

    CREATE TABLE inspection_round_items (
      round_id uuid NOT NULL REFERENCES inspection_rounds(id) ON DELETE CASCADE,
      print_id uuid NOT NULL REFERENCES prints(id) ON DELETE CASCADE,
      position integer NOT NULL,
      checked_on date,
      condition_report_id uuid REFERENCES condition_reports(id),
      added_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (round_id, print_id)
    );
    CREATE INDEX inspection_round_items_print_idx ON inspection_round_items (print_id);

    CREATE TABLE reminder_preferences (
      user_id uuid PRIMARY KEY REFERENCES users(id),
      digest_enabled boolean NOT NULL DEFAULT true,
      digest_weekday smallint NOT NULL DEFAULT 1 CHECK (digest_weekday BETWEEN 1 AND 7),
      calendar_token_sha256 text UNIQUE,
      calendar_token_created_at timestamptz,
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE digest_sends (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id),
      week text NOT NULL,
      status text NOT NULL DEFAULT 'sending' CHECK (status IN ('sending','sent','failed','empty')),
      attempts integer NOT NULL DEFAULT 0,
      last_error text,
      overdue integer NOT NULL DEFAULT 0,
      due integer NOT NULL DEFAULT 0,
      message_id text,
      sent_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (user_id, week)
    );
    CREATE INDEX digest_sends_created_idx ON digest_sends (created_at DESC);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS digest_sends, reminder_preferences, inspection_round_items, inspection_rounds, schedule_stale, print_schedules,
      climate_readings, climate_files;
  `);
}
