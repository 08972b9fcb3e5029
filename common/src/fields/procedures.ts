import { z } from 'zod';
import { isoDate } from '../schemas/primitives';
import {
  ACQUISITION_METHOD, DEACCESSION_METHOD, ENTRY_REASON,
} from '../schemas/procedure-vocab';
import { labeller, longText, requiredCode, requiredText, text, type FieldSpec } from './field';

/**
 * The fields a person enters on the procedure records: a treatment's proposal and its record, an
 * object entry, an acquisition and a deaccession. Labels, descriptions and the contract's inputs are
 * read from here (`schemas/treatments.ts`, `schemas/acquisitions.ts`, `schemas/deaccessions.ts`).
 * Every one is staff-only (`catalogue.read_restricted`: admin, registrar, conservator, researcher).
 */
const R = 'catalogue.read_restricted' as const;

const requiredDate = () => ({ type: { kind: 'text', max: 10 } as const, required: true, default: null, input: isoDate, output: isoDate });
const optionalDate = () => ({
  type: { kind: 'text', max: 10 } as const, required: false, default: null,
  input: z.preprocess((v) => (v === '' ? null : v), isoDate.nullable()).optional(), output: isoDate.nullable(),
});

const hours = {
  type: { kind: 'number', min: 0, max: 10000 } as const, unit: 'h', required: false, default: null,
  input: z.preprocess((v) => (v === '' ? null : v), z.coerce.number({ message: 'Enter a number of hours' }).min(0, 'At least 0 h').max(10000, 'At most 10000 h').nullable()).optional(),
  output: z.number().nullable(),
};

export const TREATMENT_PROPOSAL_FIELDS = [
  { key: 'proposedOn', inputKey: 'proposedOn', label: 'Proposed on', column: 'proposed_on', read: R, origin: 'entered', ...requiredDate(), example: '2025-03-04', description: 'The day the treatment was proposed.' },
  { key: 'conditionFound', inputKey: 'conditionFound', label: 'Condition found', column: 'condition_found', read: R, origin: 'entered', ...requiredText(10000, 'Describe the condition found'), type: { kind: 'long_text', max: 10000 }, example: 'Silver mirroring along the upper margin', description: 'What the examination found that calls for treatment.' },
  { key: 'aims', inputKey: 'aims', label: 'Aims', column: 'aims', read: R, origin: 'entered', ...requiredText(10000, 'Say what the treatment should achieve'), type: { kind: 'long_text', max: 10000 }, example: 'Stabilise the tear; reduce surface dirt', description: 'What the treatment should achieve, and what it should not touch.' },
  { key: 'optionsConsidered', inputKey: 'optionsConsidered', label: 'Options considered', column: 'options_considered', read: R, origin: 'entered', ...longText(10000), example: 'Dry cleaning only; humidification and flattening', description: 'The approaches weighed, with their risks.' },
  { key: 'chosenMethod', inputKey: 'chosenMethod', label: 'Chosen method', column: 'chosen_method', read: R, origin: 'entered', ...requiredText(10000, 'Name the method chosen'), type: { kind: 'long_text', max: 10000 }, example: 'Dry surface cleaning, tear repair with wheat starch paste and tissue', description: 'The approach chosen, and why.' },
] as const satisfies readonly FieldSpec[];

export const TREATMENT_APPROVAL_FIELDS = [
  { key: 'approvedByName', inputKey: 'approvedByName', label: 'Approved by', column: 'approved_by', read: R, origin: 'entered', ...requiredText(200, 'Name the person who approved it'), example: 'Ilse Marrow, Head of Collections', description: 'The person who approved the treatment, by name and post.' },
  { key: 'approvedOn', inputKey: 'approvedOn', label: 'Approved on', column: 'approved_on', read: R, origin: 'entered', ...requiredDate(), example: '2025-03-10', description: 'The day of the approval.' },
  { key: 'approvalNote', inputKey: 'approvalNote', label: 'Conditions of approval', column: 'approval_note', read: R, origin: 'entered', ...longText(2000), example: '', description: 'Anything the approval was given on condition of.' },
] as const satisfies readonly FieldSpec[];

export const TREATMENT_RECORD_FIELDS = [
  { key: 'startedOn', inputKey: 'startedOn', label: 'Started on', column: 'started_on', read: R, origin: 'entered', ...optionalDate(), example: '2025-03-12', description: 'The first day of work.' },
  { key: 'completedOn', inputKey: 'completedOn', label: 'Completed on', column: 'completed_on', read: R, origin: 'entered', ...optionalDate(), example: '2025-03-20', description: 'The last day of work.' },
  { key: 'hoursSpent', inputKey: 'hoursSpent', label: 'Hours spent', column: 'hours_spent', read: R, origin: 'entered', ...hours, example: '6.5', description: 'Time spent on the treatment in all, examination and documentation included.' },
  { key: 'summary', inputKey: 'summary', label: 'Summary of the treatment', column: 'summary', read: R, origin: 'entered', ...longText(10000), example: '', description: 'What was done, in a paragraph, for the record.' },
  { key: 'afterReportId', inputKey: 'afterReportId', label: 'Condition report after treatment', column: 'after_report_id', read: R, origin: 'entered', type: { kind: 'id' }, required: false, default: null, input: z.preprocess((v) => (v === '' ? null : v), z.string().uuid({ message: 'Not a record id' }).nullable()).optional(), output: z.string().uuid().nullable(), example: '', description: 'The condition report made after the treatment (of the same print).' },
] as const satisfies readonly FieldSpec[];

export const ENTRY_FIELDS = [
  { key: 'enteredOn', inputKey: 'enteredOn', label: 'Date of entry', column: 'entered_on', read: R, origin: 'entered', ...requiredDate(), example: '2025-05-06', description: 'The day the objects came in; the entry number is taken from its year.' },
  { key: 'depositor', inputKey: 'depositor', label: 'Depositor', column: 'depositor', read: R, origin: 'entered', ...requiredText(300, 'Name the depositor'), example: 'Orla Fenwick', description: 'The person or body who left the objects.' },
  { key: 'depositorContact', inputKey: 'depositorContact', label: 'Depositor’s address or contact', column: 'depositor_contact', read: R, origin: 'entered', ...longText(1000), example: '', description: 'Where the depositor can be reached.' },
  { key: 'reason', inputKey: 'reason', label: 'Reason for entry', column: 'reason', read: R, origin: 'entered', ...requiredCode('the entry reasons', ENTRY_REASON), example: 'possible_acquisition', description: 'Why the objects came in: offered for acquisition, a loan in, or an enquiry.' },
  { key: 'objectCount', inputKey: 'objectCount', label: 'Number of objects', column: 'object_count', read: R, origin: 'entered', type: { kind: 'number', min: 1, max: 100000, integer: true }, required: true, default: null, input: z.coerce.number({ message: 'Enter a whole number' }).int('A whole number').min(1, 'At least 1').max(100000, 'At most 100000'), output: z.number().int(), example: '3', description: 'How many objects came in.' },
  { key: 'objectsDescription', inputKey: 'objectsDescription', label: 'Objects received', column: 'objects_description', read: R, origin: 'entered', ...requiredText(10000, 'Describe the objects received'), type: { kind: 'long_text', max: 10000 }, example: 'Three toned gelatin silver prints, mounted', description: 'What came in, as the receipt will list it.' },
  { key: 'returnBy', inputKey: 'returnBy', label: 'Return by', column: 'return_by', read: R, origin: 'entered', ...optionalDate(), example: '', description: 'When objects not kept must go back, if agreed.' },
  { key: 'notes', inputKey: 'notes', label: 'Notes', column: 'notes', read: R, origin: 'entered', ...longText(4000), example: '', description: 'Anything else about the entry.' },
] as const satisfies readonly FieldSpec[];

export const ACQUISITION_FIELDS = [
  { key: 'source', inputKey: 'source', label: 'Source', column: 'source', read: R, origin: 'entered', ...requiredText(300, 'Name the source'), example: 'Orla Fenwick', description: 'From whom the collection acquires the objects.' },
  { key: 'method', inputKey: 'method', label: 'Method of acquisition', column: 'method', read: R, origin: 'entered', ...requiredCode('the acquisition methods', ACQUISITION_METHOD), example: 'gift', description: 'Gift, purchase, bequest or transfer.' },
  { key: 'approvedOn', inputKey: 'approvedOn', label: 'Approved on', column: 'approved_on', read: R, origin: 'entered', ...optionalDate(), example: '2025-06-02', description: 'The day the acquisition was approved.' },
  { key: 'acquiredOn', inputKey: 'acquiredOn', label: 'Acquired on', column: 'acquired_on', read: R, origin: 'entered', ...requiredDate(), example: '2025-06-20', description: 'The day title passed to the collection.' },
  { key: 'titleDocument', inputKey: 'titleDocument', label: 'Transfer of title document', column: 'title_document', read: R, origin: 'entered', ...text(300), example: 'Deed of gift CR/DG/2025/04', description: 'The reference of the signed document that transfers title.' },
  { key: 'funds', inputKey: 'funds', label: 'Funds', column: 'funds', read: R, origin: 'entered', ...text(300), example: 'Harlow Bequest Fund', description: 'For a purchase: the fund or grant that paid, and the price if recorded.' },
  { key: 'notes', inputKey: 'notes', label: 'Notes', column: 'notes', read: R, origin: 'entered', ...longText(4000), example: '', description: 'Anything else about the acquisition.' },
] as const satisfies readonly FieldSpec[];

export const DEACCESSION_PROPOSAL_FIELDS = [
  { key: 'proposedOn', inputKey: 'proposedOn', label: 'Proposed on', column: 'proposed_on', read: R, origin: 'entered', ...requiredDate(), example: '2025-09-01', description: 'The day the deaccession was proposed.' },
  { key: 'reason', inputKey: 'reason', label: 'Reason', column: 'reason', read: R, origin: 'entered', ...requiredText(10000, 'Give the reason'), type: { kind: 'long_text', max: 10000 }, example: 'Damaged beyond use by water', description: 'Why the print should leave the collection.' },
  { key: 'method', inputKey: 'method', label: 'Method', column: 'method', read: R, origin: 'entered', ...requiredCode('the deaccession methods', DEACCESSION_METHOD), example: 'transfer', description: 'How it leaves: transfer to another collection, return to its owner, or destruction after damage.' },
  { key: 'recipient', inputKey: 'recipient', label: 'Recipient', column: 'recipient', read: R, origin: 'entered', ...text(300), example: '', description: 'For a transfer or return: who receives the print.' },
] as const satisfies readonly FieldSpec[];

export const DEACCESSION_APPROVAL_FIELDS = [
  { key: 'authority', inputKey: 'authority', label: 'Approving authority', column: 'authority', read: R, origin: 'entered', ...requiredText(300, 'Name the authority that approved it'), example: 'Board of Trustees, minute 2025/41', description: 'The body or person that approved the deaccession, with the minute or reference.' },
  { key: 'approvedOn', inputKey: 'approvedOn', label: 'Approved on', column: 'approved_on', read: R, origin: 'entered', ...requiredDate(), example: '2025-09-18', description: 'The day of the approval.' },
] as const satisfies readonly FieldSpec[];

export const DEACCESSION_COMPLETION_FIELDS = [
  { key: 'completedOn', inputKey: 'completedOn', label: 'Completed on', column: 'completed_on', read: R, origin: 'entered', ...requiredDate(), example: '2025-10-02', description: 'The day the print left the collection or was destroyed; from then on its record is read-only.' },
  { key: 'finalNote', inputKey: 'finalNote', label: 'Final record', column: 'final_note', read: R, origin: 'entered', ...requiredText(10000, 'Write what was done, and the evidence kept'), type: { kind: 'long_text', max: 10000 }, example: 'Transferred; receipt signed by the recipient', description: 'What was done, by whom, and the evidence kept (receipt, witness to destruction).' },
] as const satisfies readonly FieldSpec[];

export const procedureLabelOf = labeller([
  ...TREATMENT_PROPOSAL_FIELDS, ...TREATMENT_APPROVAL_FIELDS, ...TREATMENT_RECORD_FIELDS, ...ENTRY_FIELDS, ...ACQUISITION_FIELDS,
  ...DEACCESSION_PROPOSAL_FIELDS, ...DEACCESSION_APPROVAL_FIELDS, ...DEACCESSION_COMPLETION_FIELDS,
]);

/** Labels of one record's fields (keys such as `reason`, `method` and `approvedOn` are shared between records, with different labels). */
export const entryLabelOf = labeller(ENTRY_FIELDS);
export const acquisitionLabelOf = labeller(ACQUISITION_FIELDS);
