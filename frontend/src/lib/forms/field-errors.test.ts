import { describe, expect, it } from 'vitest';
import { ApiError } from '@/lib/api-client';
import { fieldIssuesOf, flattenFormErrors, issuesToFieldErrors, serverFieldErrors } from '@/lib/forms/field-errors';

describe('field errors', () => {
  it('keys zod issues by their dotted path; the first message per field wins; an empty path is the whole form', () => {
    expect(
      issuesToFieldErrors([
        { path: ['observations', 2, 'termCode'], message: 'Choose what was observed' },
        { path: ['title'], message: 'Enter a title' },
        { path: ['title'], message: 'second message' },
        { path: [], message: 'Whole form' },
      ]),
    ).toEqual({ 'observations.2.termCode': 'Choose what was observed', title: 'Enter a title', '': 'Whole form' });
  });

  it('maps the server envelope’s field issues, paths like steps.2.minutes included, one per field', () => {
    const error = new ApiError({
      code: 'validation_failed',
      status: 400,
      message: 'Check the form',
      details: [
        { path: 'steps.2.minutes', message: 'Longer than any bath', code: 'custom' },
        { path: 'title', message: 'This title is reserved', code: 'custom' },
        { path: 'title', message: 'A second problem with the title', code: 'custom' },
        { path: '', message: 'The file is empty', code: 'custom' },
      ],
    });
    expect(serverFieldErrors(fieldIssuesOf(error))).toEqual({ 'steps.2.minutes': 'Longer than any bath', title: 'This title is reserved', '': 'The file is empty' });
  });

  it('shows an issue the envelope lists without its code (a taken accession number in a 409)', () => {
    const taken = new ApiError({ code: 'conflict', status: 409, message: 'In use', details: [{ path: 'accessionNumber', message: '2001.4.1 is already used' }] });
    expect(serverFieldErrors(fieldIssuesOf(taken))).toEqual({ accessionNumber: '2001.4.1 is already used' });
    expect(fieldIssuesOf(new Error('offline'))).toEqual([]);
  });

  it('moves an issue to the field that shows it when the form’s names differ from the contract’s', () => {
    const fieldFor = (path: string) => path.replace(/^readings\.0\./, 'spots.3.');
    expect(serverFieldErrors([{ path: 'readings.0.density', message: 'Density is at most 5' }], fieldFor)).toEqual({
      'spots.3.density': 'Density is at most 5',
    });
  });

  it('ignores details that are not field issues (a stale edit’s record, an unknown shape)', () => {
    const stale = new ApiError({ code: 'conflict', status: 409, message: 'Changed', details: { current: {}, lastChangedBy: null, lastChangedAt: null } });
    expect(serverFieldErrors(fieldIssuesOf(stale))).toEqual({});
    const odd = new ApiError({ code: 'validation_failed', status: 400, message: 'x', details: [{ path: 'x' }, 'nonsense', null] });
    expect(serverFieldErrors(fieldIssuesOf(odd))).toEqual({});
  });

  it('flattens react-hook-form’s nested errors, a list’s own problem at the list and the form’s at ""', () => {
    expect(
      flattenFormErrors({
        title: { type: 'server', message: 'This title is reserved', ref: {} },
        steps: [undefined, { timeSeconds: { type: 'validate', message: 'Enter a time' }, type: { type: 'x', message: 'Choose a kind' } }],
        ingredients: { root: { type: 'too_small', message: 'Add at least one ingredient' } },
        root: { form: { type: 'server', message: 'Not allowed' } },
      }),
    ).toEqual({
      title: 'This title is reserved',
      'steps.1.timeSeconds': 'Enter a time',
      'steps.1.type': 'Choose a kind',
      ingredients: 'Add at least one ingredient',
      '': 'Not allowed',
    });
  });
});
