import { describe, expect, it } from 'vitest';
import { issuesToErrors, serverIssuesToErrors } from '@/lib/form-errors';

describe('form errors', () => {
  it('keys zod issues by their dotted path, first message wins, empty path is the whole form', () => {
    expect(
      issuesToErrors([
        { path: ['observations', 2, 'termCode'], message: 'Choose what was observed' },
        { path: ['title'], message: 'Enter a title' },
        { path: ['title'], message: 'second message' },
        { path: [], message: 'Whole form' },
      ]),
    ).toEqual({ 'observations.2.termCode': 'Choose what was observed', title: 'Enter a title', form: 'Whole form' });
  });

  it('reads the server envelope details and ignores anything that is not a field issue', () => {
    expect(
      serverIssuesToErrors([
        { path: 'accessionNumber', message: 'Another print already has this accession number.', code: 'unique' },
        { path: '', message: 'The file is empty' },
        { path: 'x' },
        'nonsense',
        null,
      ]),
    ).toEqual({ accessionNumber: 'Another print already has this accession number.', form: 'The file is empty' });
    expect(serverIssuesToErrors({ current: {} })).toEqual({});
  });
});
