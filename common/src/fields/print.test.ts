import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import {
  PRINT_SORTS, printInputSchema, printListItemSchema, printSchema, printUpdateSchema, processStepInputSchema, processStepSchema,
} from '../schemas/catalogue';
import { blankValues, enteredFields, labelWithUnit, readCode, readersOf, readYesNo, toCell } from './field';
import { ENTERED_PRINT_FIELDS, PRINT_FIELDS, PRINT_KEYS_BEYOND_FIELDS, labelOf, printField } from './print';
import { STEP_FIELDS, stepLabelOf } from './step';

const keys = (schema: z.ZodObject) => Object.keys(schema.shape).sort();
const sorted = (xs: readonly string[]) => [...xs].sort();

describe('the print field table and the contract', () => {
  it('printInputSchema has exactly the input of every entered field, and nothing else', () => {
    expect(keys(printInputSchema)).toEqual(sorted(ENTERED_PRINT_FIELDS.map((f) => f.inputKey)));
    for (const f of PRINT_FIELDS) expect('inputKey' in f, f.key).toBe(f.origin === 'entered');
  });

  it('printSchema has every field of the table plus the keys listed as beyond it, and nothing else', () => {
    expect(keys(printSchema)).toEqual(sorted([...PRINT_FIELDS.map((f) => f.key), ...PRINT_KEYS_BEYOND_FIELDS]));
  });

  it('restricted and valuation fields are optional in printSchema (left out for roles that may not read them); every other field is always there', () => {
    for (const f of PRINT_FIELDS) {
      const schema = printSchema.shape[f.key];
      expect(schema.safeParse(undefined).success, f.key).toBe(f.read === 'catalogue.read_restricted' || f.read === 'valuation.read');
    }
    expect(PRINT_FIELDS.filter((f) => f.read !== 'catalogue.read').map((f) => f.key)).toEqual([
      'location', 'staffNotes', 'valuationAmount', 'valuationCurrency',
    ]);
  });

  it('valuations are read by registrars and administrators only', () => {
    expect(PRINT_FIELDS.filter((f) => f.read === 'valuation.read').map((f) => f.key)).toEqual(['valuationAmount', 'valuationCurrency']);
    for (const key of ['valuationAmount', 'valuationCurrency']) expect(readersOf(printField(key)!), key).toEqual(['admin', 'registrar']);
    expect(readersOf(printField('staffNotes')!)).toEqual(['admin', 'registrar', 'conservator', 'researcher']);
  });

  it('a valuation currency is an ISO 4217 code from the list: any case, kept in capitals; anything else is refused', () => {
    const currency = printInputSchema.shape.valuationCurrency;
    expect(currency.parse('EUR')).toBe('EUR');
    expect(currency.parse('gbp')).toBe('GBP');
    expect(currency.parse(' usd ')).toBe('USD');
    expect(currency.parse('')).toBeNull();
    for (const bad of ['POU', 'pounds', 'XXX', 'XTS', 'XAU', 'EU', 'EURO', 42]) {
      const r = currency.safeParse(bad);
      expect(r.success, String(bad)).toBe(false);
    }
    expect(currency.safeParse('POU').error?.issues[0]?.message).toBe('"POU" is not an ISO 4217 currency code (such as GBP, EUR or USD)');
  });

  it('an update cannot set what is set only on create (a location changes by a movement)', () => {
    const createOnly = ENTERED_PRINT_FIELDS.filter((f) => f.createOnly);
    expect(createOnly.map((f) => f.key)).toEqual(['location']);
    for (const f of createOnly) expect(Object.keys(printUpdateSchema.shape)).not.toContain(f.inputKey);
    expect(Object.keys(printUpdateSchema.shape)).toContain('makerId');
  });

  it('the list carries the fields marked list, and sorts by the fields marked sort', () => {
    for (const f of PRINT_FIELDS.filter((x) => 'list' in x && x.list)) expect(Object.keys(printListItemSchema.shape)).toContain(f.key);
    expect(PRINT_SORTS).toEqual(['accessionNumber', 'title', 'maker', 'dateMade', 'status', 'updatedAt']);
  });

  it('keys, input keys, CSV columns and labels are each unique; columns are snake_case', () => {
    for (const list of [PRINT_FIELDS.map((f) => f.key), ENTERED_PRINT_FIELDS.map((f) => f.inputKey), PRINT_FIELDS.map((f) => f.column), PRINT_FIELDS.map((f) => f.label)]) {
      expect(new Set(list).size).toBe(list.length);
    }
    for (const f of [...PRINT_FIELDS, ...STEP_FIELDS]) expect(f.column).toMatch(/^[a-z][a-z0-9]*(_[a-z0-9]+)*$/);
  });

  it('every example passes its own field: codes are codes of the list, values pass the input schema', () => {
    for (const f of ENTERED_PRINT_FIELDS) {
      if (f.type.kind === 'reference') expect(f.example.length, f.key).toBeGreaterThan(0);
      else if (f.type.kind === 'code') expect(f.type.codes, f.key).toContain(f.example);
      else expect(f.input.safeParse(f.example).success, `${f.key}: ${f.example}`).toBe(true);
    }
    const toners = PRINT_FIELDS.find((f) => f.key === 'tonerClasses')!;
    for (const part of toners.example.split(';')) expect(readCode(toners.type as never, part)).toBe(part);
  });

  it('the defaults complete a record: accession number and title alone make a valid new print', () => {
    const defaults = Object.fromEntries(ENTERED_PRINT_FIELDS.map((f) => [f.inputKey, f.default]));
    const parsed = printInputSchema.safeParse({ ...defaults, accessionNumber: '1987.14.3', title: 'Harbour wall, low tide' });
    expect(parsed.success).toBe(true);
    expect(parsed.data).toMatchObject({ process: 'gelatin_silver_developing_out', status: 'in_store', makerId: null, imageWidthMm: null });
    expect(ENTERED_PRINT_FIELDS.filter((f) => f.required).map((f) => f.key)).toEqual(['accessionNumber', 'title']);
  });

  it('labels read by key, input key or column, with the unit; an unknown key reads as itself', () => {
    expect(labelOf('makerId')).toBe('Maker');
    expect(labelOf('maker')).toBe('Maker');
    expect(labelOf('image_width_mm')).toBe('Image width (mm)');
    expect(labelOf('steps')).toBe('Process history');
    expect(labelOf('colour')).toBe('colour');
    expect(printField('paperId')?.column).toBe('paper');
    expect(labelWithUnit({ label: 'Temperature', unit: '°C' })).toBe('Temperature (°C)');
  });

  it('blank values give null for every public field that may be empty, and pass printSchema with the rest', () => {
    const blanks = blankValues(PRINT_FIELDS);
    expect(Object.keys(blanks)).toContain('inscriptions');
    expect(Object.keys(blanks)).not.toContain('staffNotes');
    expect(Object.keys(blanks)).not.toContain('title');
  });
});

describe('the step field table and the contract', () => {
  it('processStepInputSchema and processStepSchema have the entered step fields, and the output adds the id and place', () => {
    expect(keys(processStepInputSchema)).toEqual(sorted(enteredFields(STEP_FIELDS).map((f) => f.inputKey!)));
    expect(keys(processStepSchema)).toEqual(sorted(['id', 'position', ...enteredFields(STEP_FIELDS).map((f) => f.key)]));
  });

  it('the example row of the steps file is a valid toning step', () => {
    const row = Object.fromEntries(enteredFields(STEP_FIELDS).map((f) => [f.inputKey, f.type.kind === 'reference' || f.example === '' ? null : f.example]));
    expect(processStepInputSchema.safeParse(row).success).toBe(true);
    expect(stepLabelOf('time_seconds')).toBe('Time (s)');
  });
});

describe('cells', () => {
  it('reads as a CSV cell: none empty, lists with ;, yes/no, numbers as written', () => {
    expect(toCell(null)).toBe('');
    expect(toCell(['selenium', 'gold'])).toBe('selenium;gold');
    expect(toCell(true)).toBe('yes');
    expect(toCell(203.5)).toBe('203.5');
  });

  it('reads a code by code or label in any case, and yes/no in the usual spellings', () => {
    const process = PRINT_FIELDS.find((f) => f.key === 'process')!.type;
    expect(readCode(process, 'Gelatin silver, developing-out')).toBe('gelatin_silver_developing_out');
    expect(readCode(process, 'CYANOTYPE')).toBe('cyanotype');
    expect(readCode(process, '')).toBeNull();
    expect(readCode(process, 'tintype')).toBeUndefined();
    expect([readYesNo('Yes'), readYesNo('0'), readYesNo(''), readYesNo('maybe')]).toEqual([true, false, null, undefined]);
  });
});
