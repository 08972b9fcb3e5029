import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import { STEP_FIELDS } from '@toneledger/common/fields/step';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { FieldsPage } from '@/features/catalogue/routes/fields-page';

function rowOf(table: HTMLElement, label: string) {
  const header = within(table).getByRole('rowheader', { name: label });
  return within(header.closest('tr')!).getAllByRole('cell').map((c) => c.textContent);
}

describe('FieldsPage', () => {
  it('lists every print field and every step field from the tables, in column order', () => {
    renderPage(<FieldsPage />, { path: '/catalogue/fields', me: makeMe('viewer') });
    const [prints, steps] = screen.getAllByRole('table');
    const columns = (table: HTMLElement) => within(table).getAllByRole('row').slice(1).map((r) => within(r).getAllByRole('cell')[0].textContent);
    expect(columns(prints)).toEqual(PRINT_FIELDS.map((f) => f.column));
    expect(columns(steps)).toEqual(STEP_FIELDS.map((f) => f.column));
  });

  it('describes a restricted field to a viewer in full, saying who may read it', () => {
    renderPage(<FieldsPage />, { path: '/catalogue/fields', me: makeMe('viewer') });
    const [prints] = screen.getAllByRole('table');
    expect(rowOf(prints, 'Staff notes')).toEqual([
      'staff_notes', 'Text, paragraphs (at most 10000 characters)', '', 'Optional',
      'Restricted: Administrator, Registrar, Conservator, Researcher', 'Notes for staff only: never shown to viewers.',
      'Matched to the negative register, volume 3.',
    ]);
    const process = rowOf(prints, 'Process');
    expect(process[1]).toContain('gelatin_silver_developing_out — Gelatin silver, developing-out');
    expect(process[3]).toBe('Optional; empty: gelatin_silver_developing_out');
    expect(process[4]).toBe('Every role');
    expect(rowOf(prints, 'Image width')[2]).toBe('mm');
    expect(rowOf(prints, 'Accession number')[3]).toBe('Required');
    expect(rowOf(prints, 'Warnings')[3]).toBe('Computed; ignored on import.');
  });
});
