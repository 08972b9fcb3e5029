import { formatDuration } from '../domain/duration';
import { LOAN_STATUS_LABELS, LOAN_DIRECTION_LABELS, LOAN_PURPOSE_LABELS } from '../schemas/loans';
import { STATUS, STEP_TYPE, TONER_CLASS, TONING_EXTENT, PROCESS, SUPPORT, LIGHT_RESPONSIVITY, THIOSULFATE_METHOD, YES_NO_UNKNOWN } from '../schemas/vocab';
import { labelOf, printField } from './print';
import { stepLabelOf } from './step';

/**
 * The audit trail in people's words: each action as a sentence ("Maren Oakshott replaced the
 * process history of print 1987.14.3") and each change as field label, value before, value after,
 * formatted as the screens show them (labels of codes, m:ss for bath times, names of references,
 * dates as YYYY-MM-DD). The audit screen, the print's history and the audit CSV all use these, so
 * no internal code, raw JSON or seconds-for-m:ss reaches a reader.
 */

/** What each action did, as the verb phrase of a sentence, and as a short label for pickers. */
export const AUDIT_ACTIONS: Record<string, { does: string; label: string; record?: string }> = {
  'session.signed_in': { does: 'signed in', label: 'Signed in' },
  'session.signed_out': { does: 'signed out', label: 'Signed out' },
  'user.created': { does: 'added the person', label: 'Person added', record: 'person' },
  'user.provisioned': { does: 'first signed in as', label: 'Person first signed in', record: 'person' },
  'user.role_changed': { does: 'changed the role of', label: 'Role changed', record: 'person' },
  'print.created': { does: 'catalogued', label: 'Print catalogued', record: 'print' },
  'print.imported': { does: 'imported', label: 'Print imported from CSV', record: 'print' },
  'print.updated': { does: 'edited', label: 'Print edited', record: 'print' },
  'print.steps_replaced': { does: 'replaced the process history of', label: 'Process history replaced', record: 'print' },
  'print.moved': { does: 'moved', label: 'Print moved', record: 'print' },
  'print.deleted': { does: 'deleted', label: 'Print deleted', record: 'print' },
  'print.light_responsivity_set': { does: 'set the light category of', label: 'Light category set', record: 'print' },
  'print_schedule.overridden': { does: 'set the next inspection of', label: 'Inspection date set', record: 'print' },
  'condition_report.created': { does: 'started a condition report on', label: 'Condition report started', record: 'condition report' },
  'condition_report.updated': { does: 'edited the condition report on', label: 'Condition report edited', record: 'condition report' },
  'condition_report.signed': { does: 'signed the condition report on', label: 'Condition report signed', record: 'condition report' },
  'condition_report.discarded': { does: 'discarded the draft condition report on', label: 'Draft report discarded', record: 'condition report' },
  'condition_report.addendum_added': { does: 'added an addendum to the condition report on', label: 'Addendum added', record: 'condition report' },
  'condition_term.created': { does: 'added the condition term', label: 'Condition term added', record: 'condition term' },
  'condition_term.updated': { does: 'changed the condition term', label: 'Condition term changed', record: 'condition term' },
  'measurement_spot.created': { does: 'registered the measurement spot', label: 'Measurement spot registered', record: 'measurement spot' },
  'measurement_spot.updated': { does: 'changed the measurement spot', label: 'Measurement spot changed', record: 'measurement spot' },
  'measurement_spot.baseline_chosen': { does: 'chose the baseline of the measurement spot', label: 'Baseline chosen', record: 'measurement spot' },
  'measurement_spot.baseline_reset': { does: 'reset the baseline of the measurement spot', label: 'Baseline reset', record: 'measurement spot' },
  'measurement_session.recorded': { does: 'recorded a measurement session', label: 'Measurement session recorded' },
  'image.uploaded': { does: 'uploaded an image', label: 'Image uploaded' },
  'image.updated': { does: 'changed the details of an image', label: 'Image details changed' },
  'image.withdrawn': { does: 'withdrew an image', label: 'Image withdrawn' },
  'image.purged': { does: 'purged an image', label: 'Image purged' },
  'maker.created': { does: 'added the maker', label: 'Maker added', record: 'maker' },
  'location.created': { does: 'added the location', label: 'Location added', record: 'location' },
  'loan.created': { does: 'proposed', label: 'Loan proposed', record: 'loan' },
  'loan.updated': { does: 'edited', label: 'Loan edited', record: 'loan' },
  'loan.status_changed': { does: 'changed the status of', label: 'Loan status changed', record: 'loan' },
  'loan.objects_set': { does: 'changed the prints on', label: 'Prints on a loan changed', record: 'loan' },
  'loan.object_removed': { does: 'took a print off', label: 'Print taken off a loan', record: 'loan' },
  'loan.borrowed_added': { does: 'recorded a borrowed print on', label: 'Borrowed print recorded', record: 'loan' },
  'exhibition.created': { does: 'created the exhibition', label: 'Exhibition created', record: 'exhibition' },
  'exhibition.updated': { does: 'edited the exhibition', label: 'Exhibition edited', record: 'exhibition' },
  'exhibition.deleted': { does: 'deleted the exhibition', label: 'Exhibition deleted', record: 'exhibition' },
  'exhibition.objects_added': { does: 'added prints to the exhibition', label: 'Prints added to an exhibition', record: 'exhibition' },
  'exhibition.object_removed': { does: 'took a print out of the exhibition', label: 'Print taken out of an exhibition', record: 'exhibition' },
  'exhibition.object_approved': { does: 'approved a print for display in the exhibition', label: 'Print approved for display', record: 'exhibition' },
  'exhibition.approval_reopened': { does: 'reopened the approval of a print in the exhibition', label: 'Approval reopened', record: 'exhibition' },
  'display.created': { does: 'recorded a display period', label: 'Display period recorded' },
  'display.updated': { does: 'changed a display period', label: 'Display period changed' },
  'display.deleted': { does: 'deleted a display period', label: 'Display period deleted' },
  'climate_file.uploaded': { does: 'uploaded a climate logger file', label: 'Climate file uploaded' },
  'climate_file.accepted': { does: 'accepted a climate logger file', label: 'Climate file accepted' },
  'climate_file.discarded': { does: 'discarded a climate logger file', label: 'Climate file discarded' },
  'inspection_round.created': { does: 'planned the inspection round', label: 'Inspection round planned', record: 'inspection round' },
  'inspection_round.updated': { does: 'changed the inspection round', label: 'Inspection round changed', record: 'inspection round' },
  'research_query.created': { does: 'saved the research query', label: 'Research query saved', record: 'research query' },
  'research_query.updated': { does: 'changed the research query', label: 'Research query changed', record: 'research query' },
  'research_query.deleted': { does: 'deleted the research query', label: 'Research query deleted', record: 'research query' },
  'research.exported': { does: 'exported a research query', label: 'Research exported' },
  'settings.updated': { does: 'changed the settings', label: 'Settings changed' },
  'reminders.updated': { does: 'changed the reminder settings', label: 'Reminder settings changed' },
  'calendar_feed.made': { does: 'made a calendar feed', label: 'Calendar feed made' },
  'calendar_feed.ended': { does: 'ended a calendar feed', label: 'Calendar feed ended' },
  'mail.test_sent': { does: 'sent a test mail', label: 'Test mail sent' },
  create: { does: 'added', label: 'Record added' },
  update: { does: 'changed', label: 'Record changed' },
};

/** An action's code as words, for an action this table does not know yet: `loan.status_changed` → "loan status changed". */
function wordsOfCode(code: string): string {
  return code.replace(/[._]/g, ' ').trim();
}

/** The short label of an action (the picker, the CSV's action column). */
export function actionLabel(action: string): string {
  const known = AUDIT_ACTIONS[action]?.label;
  if (known) return known;
  const words = wordsOfCode(action);
  return words.charAt(0).toUpperCase() + words.slice(1);
}

type Snapshot = Record<string, unknown>;
const isObject = (v: unknown): v is Snapshot => typeof v === 'object' && v !== null && !Array.isArray(v);

/** How a record is named in a sentence: a print by its accession number, a loan by its reference, others by name or title. */
export function recordName(entityType: string, before: unknown, after: unknown): string | null {
  const s = isObject(after) ? after : isObject(before) ? before : null;
  if (!s) return null;
  const text = (k: string) => (typeof s[k] === 'string' && (s[k] as string).trim() ? (s[k] as string) : null);
  if (entityType === 'print') return text('accessionNumber') ? `print ${text('accessionNumber')}` : null;
  if (entityType === 'loan') return text('reference') ? `loan ${text('reference')}` : null;
  if (entityType === 'condition_report') return text('accessionNumber') ? `print ${text('accessionNumber')}` : null;
  if (entityType === 'user') return text('name') ?? text('email');
  return text('name') ?? text('title') ?? text('label') ?? text('reference') ?? text('accessionNumber');
}

/** "Maren Oakshott replaced the process history of print 1987.14.3." */
export function auditSentence(e: { actorName: string | null; action: string; entityType: string; before: unknown; after: unknown }, knownName: string | null = null): string {
  const who = e.actorName ?? 'The system';
  const known = AUDIT_ACTIONS[e.action];
  const name = recordName(e.entityType, e.before, e.after) ?? knownName;
  if (!known) return `${who}: ${wordsOfCode(e.action)}${name ? ` (${name})` : ''}.`;
  if (!known.record) return `${who} ${known.does}.`;
  // Without a name: "added the maker" becomes "added a maker", "edited" becomes "edited a loan".
  const the = ` the ${known.record}`;
  let sentence = name ? `${who} ${known.does} ${name}` : `${who} ${known.does.endsWith(the) ? known.does.slice(0, -the.length) : known.does} a ${known.record}`;
  if (e.action === 'print.moved' && isObject(e.after) && typeof e.after.location === 'string') sentence += ` to ${e.after.location}`;
  if (e.action === 'loan.status_changed' && isObject(e.after) && typeof e.after.status === 'string') sentence += ` to ${LOAN_STATUS_LABELS[e.after.status as keyof typeof LOAN_STATUS_LABELS] ?? 'its next step'}`;
  if (e.action === 'user.role_changed' && isObject(e.after) && typeof e.after.role === 'string') sentence += ` to ${e.after.role}`;
  return `${sentence}.`;
}

/** Labels of codes by the key that holds them, per record type (a loan's status is not a print's). */
const CODE_LABELS: Record<string, Record<string, Record<string, string>>> = {
  print: { status: STATUS.labels, process: PROCESS.labels, support: SUPPORT.labels, lightResponsivity: LIGHT_RESPONSIVITY.labels, tonerClasses: TONER_CLASS.labels },
  loan: { status: LOAN_STATUS_LABELS, direction: LOAN_DIRECTION_LABELS, purpose: LOAN_PURPOSE_LABELS },
  step: { type: STEP_TYPE.labels, tonerClass: TONER_CLASS.labels, extent: TONING_EXTENT.labels, method: THIOSULFATE_METHOD.labels, alkaline: YES_NO_UNKNOWN.labels },
};

/** A field's label: from the field tables for prints and process steps, otherwise its key in words. */
export function changeLabel(entityType: string, key: string): string {
  if (entityType === 'print' || printField(key)) {
    const label = labelOf(key);
    if (label !== key) return label;
  }
  const words = key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/_/g, ' ').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

const ISO_DATE_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/;
const SNAKE_CODE = /^[a-z]+(_[a-z0-9]+)+$/;

/** One process step as a line: "Toning, Selenium, 2:30, 20 °C". */
function stepLine(step: Snapshot): string {
  const label = (k: string) => (typeof step[k] === 'string' ? (CODE_LABELS.step[k]?.[step[k] as string] ?? (step[k] as string)) : null);
  const recipe = isObject(step.recipe) && typeof step.recipe.name === 'string' ? step.recipe.name : null;
  const parts = [
    label('type'), label('tonerClass'), typeof step.agent === 'string' ? step.agent : null, recipe,
    typeof step.dilution === 'string' ? step.dilution : null,
    typeof step.timeSeconds === 'number' ? formatDuration(step.timeSeconds) : null,
    typeof step.temperatureC === 'number' ? `${step.temperatureC} °C` : null,
    label('extent'),
  ];
  return parts.filter((p): p is string => Boolean(p)).join(', ');
}

/** A recorded value as people read it. */
export function formatAuditValue(entityType: string, key: string, value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  const codes = CODE_LABELS[entityType]?.[key];
  if (typeof value === 'string') {
    if (codes?.[value]) return codes[value];
    if (ISO_DATE_TIME.test(value)) return `${value.slice(0, 10)} ${value.slice(11, 16)} UTC`;
    // A code this table does not know is still shown in words, never as `in_store`.
    if (SNAKE_CODE.test(value)) return value.replace(/_/g, ' ');
    return value;
  }
  if (typeof value === 'number') {
    if (/seconds$/i.test(key)) return formatDuration(value);
    return String(value);
  }
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  if (Array.isArray(value)) {
    if (value.length === 0) return 'none';
    if (value.every((v) => isObject(v) && typeof v.type === 'string')) return value.map((v, i) => `${i + 1}. ${stepLine(v as Snapshot)}`).join('\n');
    return value.map((v) => formatAuditValue(entityType, key, v)).join(', ');
  }
  if (isObject(value)) {
    for (const k of ['pathLabel', 'label', 'name', 'title', 'reference']) if (typeof value[k] === 'string') return value[k] as string;
    return Object.entries(value)
      .filter(([, v]) => v !== null && v !== undefined && v !== '')
      .map(([k, v]) => `${changeLabel(entityType, k)}: ${formatAuditValue(entityType, k, v)}`)
      .join('; ') || '—';
  }
  return String(value);
}

export interface ReadableChange {
  /** The key in the snapshot (kept for filtering by permission). */
  field: string;
  label: string;
  before: string;
  after: string;
}

/** Keys of snapshots that are bookkeeping, not something a person changed. */
const NOT_SHOWN = new Set(['id', 'version', 'createdAt', 'updatedAt', 'printId']);

/**
 * The fields that differ between two snapshots, labelled and formatted. When one side is absent
 * (a record created or deleted) every field with a value on the other side is listed.
 */
export function readableChanges(entityType: string, before: unknown, after: unknown): ReadableChange[] {
  const b = isObject(before) ? before : {};
  const a = isObject(after) ? after : {};
  if (!isObject(before) && !isObject(after)) return [];
  const keys = [...new Set([...Object.keys(b), ...Object.keys(a)])].filter((k) => !NOT_SHOWN.has(k));
  return keys
    .filter((k) => JSON.stringify(b[k] ?? null) !== JSON.stringify(a[k] ?? null))
    .map((k) => ({ field: k, label: changeLabel(entityType, k), before: formatAuditValue(entityType, k, b[k]), after: formatAuditValue(entityType, k, a[k]) }));
}

/** The steps' own labels, for a change inside a process step. */
export { stepLabelOf };
