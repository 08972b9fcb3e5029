import { z } from 'zod';
import { parseDuration } from '../domain/duration';
import { id } from '../schemas/primitives';
import { STEP_TYPE, THIOSULFATE_METHOD, TONER_CLASS, TONING_EXTENT } from '../schemas/vocab';
import { code, labeller, longText, reference, requiredCode, text, type FieldSpec } from './field';

/** A step's time: seconds, or text as m:ss (`1:30`) or whole seconds (`90`); empty text is none. */
const seconds = z
  .preprocess(
    (v) => {
      if (typeof v !== 'string') return v;
      const read = parseDuration(v);
      return read === undefined ? v : read;
    },
    z.number({ message: 'Enter a time as m:ss or seconds, e.g. 1:30 or 90' }).int('Whole seconds').min(0).max(7 * 24 * 3600, 'At most a week (10080:00)').nullable(),
  )
  .optional();

const R = 'catalogue.read' as const;

/**
 * The process history of a print, one step per row, as the steps CSV carries it: the print's
 * accession number and the step's order, then the step's own fields. The step's own fields are the
 * contract's step input (`processStepInputSchema` is built from them).
 */
export const STEP_FIELDS = [
  {
    key: 'accessionNumber', label: 'Accession number', column: 'accession_number', read: R, origin: 'system',
    type: { kind: 'text', max: 60 }, required: true, default: null, example: '1987.14.3',
    description: 'The print the step belongs to: a print in the prints file, or one already in the catalogue.',
  },
  {
    key: 'position', label: 'Step', column: 'step', read: R, origin: 'system',
    type: { kind: 'number', min: 1, max: 60, integer: true }, required: true, default: null, output: z.number().int(), example: '1',
    description: "The step's place in the print's process history: 1, 2, 3… Rows may come in any order; each print's numbers must differ.",
  },
  {
    key: 'type', inputKey: 'type', label: 'Step type', column: 'type', read: R, origin: 'entered',
    ...requiredCode('the step types', STEP_TYPE), example: 'toning', description: 'What the step was: development, fixing, washing, toning, an after-bath, a test…',
  },
  {
    key: 'agent', inputKey: 'agent', label: 'Agent', column: 'agent', read: R, origin: 'entered',
    ...text(200), input: text(200).input.describe('Developer, fixer, wash or solution as used'), example: 'Selenium toner',
    description: 'The developer, fixer, wash or solution as used.',
  },
  {
    key: 'tonerClass', inputKey: 'tonerClass', label: 'Toner', column: 'toner_class', read: R, origin: 'entered',
    ...code('the toner classes', TONER_CLASS), example: 'selenium', description: 'For a toning step (and only there): the class of toner.',
  },
  {
    key: 'recipe', inputKey: 'recipeId', label: 'Recipe', column: 'recipe', read: R, origin: 'entered',
    ...reference('recipe', 'name as listed under Recipes', z.object({ id, name: z.string() })), example: 'Selenium 1+9',
    description: 'The bath recipe, as listed under Recipes.',
  },
  {
    key: 'dilution', inputKey: 'dilution', label: 'Dilution', column: 'dilution', read: R, origin: 'entered',
    ...text(50), example: '1+9', description: 'Dilution of the working solution, as written (1+9, 1:20).',
  },
  {
    key: 'timeSeconds', inputKey: 'timeSeconds', label: 'Time', column: 'time_seconds', unit: 's', read: R, origin: 'entered',
    type: { kind: 'duration' }, required: false, default: null, input: seconds, output: z.number().int().nullable(), example: '240',
    description: 'How long the step took, in seconds (an import also reads m:ss, e.g. 4:00).',
  },
  {
    key: 'temperatureC', inputKey: 'temperatureC', label: 'Temperature', column: 'temperature_c', unit: '°C', read: R, origin: 'entered',
    type: { kind: 'number', min: -10, max: 100 }, required: false, default: null,
    input: z.preprocess((v) => (v === '' ? null : v), z.coerce.number({ message: 'Enter °C' }).min(-10).max(100).nullable()).optional(),
    output: z.number().nullable(), example: '20', description: 'Temperature of the bath.',
  },
  {
    key: 'extent', inputKey: 'extent', label: 'Extent', column: 'extent', read: R, origin: 'entered',
    ...code('the toning extents', TONING_EXTENT), example: 'partial', description: 'For a toning step: how far the toning went (full, partial, local). A split effect goes in the notes ("Split effect.").',
  },
  {
    key: 'concentration', inputKey: 'concentration', label: 'Concentration', column: 'concentration', read: R, origin: 'entered',
    ...text(100), example: '', description: 'Concentration of the solution, as written.',
  },
  {
    key: 'alkaline', inputKey: 'alkaline', label: 'Alkaline', column: 'alkaline', read: R, origin: 'entered',
    type: { kind: 'yes_no' }, required: false, default: null, input: z.boolean().nullable().optional(), output: z.boolean().nullable(), example: '',
    description: 'For an after-bath: whether the solution is alkaline (yes, no, or empty for unknown). Feeds the iron-blue warning.',
  },
  {
    key: 'method', inputKey: 'method', label: 'Test method', column: 'method', read: R, origin: 'entered',
    ...code('the residual-thiosulfate test methods', THIOSULFATE_METHOD), example: '',
    description: 'For a residual-thiosulfate test (and only there): the method.',
  },
  {
    key: 'value', inputKey: 'value', label: 'Measured value', column: 'value', read: R, origin: 'entered',
    type: { kind: 'number', min: -1e12, max: 1e12 }, required: false, default: null,
    input: z.preprocess((v) => (v === '' ? null : v), z.coerce.number().nullable()).optional(), output: z.number().nullable(), example: '',
    description: 'For a test: the value measured, in the unit of the next column.',
  },
  {
    key: 'unit', inputKey: 'unit', label: 'Unit of the value', column: 'unit', read: R, origin: 'entered',
    ...text(50), example: '', description: 'The unit of the measured value, e.g. µg/cm².',
  },
  {
    key: 'notes', inputKey: 'notes', label: 'Notes', column: 'notes', read: R, origin: 'entered',
    ...longText(2000), example: 'Toned to a cool purple-black', description: 'Anything else about the step.',
  },
] as const satisfies readonly FieldSpec[];

export type StepFieldSpec = (typeof STEP_FIELDS)[number];

/** The label of a step field by its key, input key or CSV column. */
export const stepLabelOf = labeller(STEP_FIELDS);
