import type { PrintSection } from '../section';

/** Sessions before spots: a spot's baseline refers to a session; readings name both. */
export const measurementSessions: PrintSection = {
  key: 'measurementSessions', table: 'measurement_sessions', parentColumn: 'print_id', orderBy: 't.measured_on, t.created_at, t.id',
  description: 'Measurement sessions: when, with which instrument and conditions, by whom.',
  children: [{ key: 'void', table: 'measurement_session_voids', parentColumn: 'session_id', orderBy: 't.voided_at', description: 'A session set aside from every analysis, with the reason (its readings stay on record).' }],
};

export const measurementSpots: PrintSection = {
  key: 'measurementSpots', table: 'measurement_spots', parentColumn: 'print_id', orderBy: 't.id',
  description: 'The spots measured on the print, each with its readings (colour and density) per session.',
  // The baseline columns go together (a check constraint), written once the readings are in.
  writeAfter: ['baseline_session_id', 'baseline_chosen_at', 'baseline_reason', 'baseline_chosen_by'],
  children: [{ key: 'readings', table: 'spot_readings', parentColumn: 'spot_id', orderBy: 't.session_id', description: 'One spot\'s reading in one session.' }],
};
