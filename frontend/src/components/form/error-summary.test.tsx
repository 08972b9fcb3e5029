import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen, within } from '@testing-library/react';
import { ErrorSummary } from '@/components/form/error-summary';

function Page({ errors }: { errors: Record<string, string> }) {
  return (
    <form>
      <ErrorSummary errors={errors} labelFor={(path) => (path === 'rows.0.amount' ? 'Row 1, amount' : null)} />
      <label htmlFor="a">Accession number</label>
      <input id="a" name="accessionNumber" />
      <label htmlFor="t">Title</label>
      <input id="t" name="title" />
      <div id="g" role="radiogroup" aria-label="Overall grade" data-field="grade" tabIndex={-1} />
      <label htmlFor="r">Amount</label>
      <input id="r" name="rows.0.amount" />
    </form>
  );
}

describe('error summary', () => {
  it('lists problems in the order of the fields on the page, the whole form first, each field once', () => {
    render(<Page errors={{ 'rows.0.amount': 'Enter a number', title: 'Required', '': 'Someone else is editing', accessionNumber: 'Taken', grade: 'Give a grade' }} />);
    const alert = screen.getByRole('alert');
    expect(within(alert).getAllByRole('listitem').map((li) => li.textContent)).toEqual([
      'Someone else is editing',
      'Accession number: Taken',
      'Title: Required',
      'Overall grade: Give a grade',
      'Row 1, amount: Enter a number',
    ]);
    expect(alert.textContent).toContain('Not saved: 4 fields need attention.');
  });

  it('links each problem to its field and moves focus there', () => {
    render(<Page errors={{ title: 'Required' }} />);
    const link = screen.getByRole('link', { name: 'Title: Required' });
    expect(link.getAttribute('href')).toBe('#t');
    fireEvent.click(link);
    expect(document.activeElement).toBe(screen.getByLabelText('Title'));
    expect(screen.getByRole('alert').textContent).toContain('Not saved: one field needs attention.');
  });

  it('shows nothing when there is no problem, and a field not on the page after the others', () => {
    const { rerender } = render(<Page errors={{}} />);
    expect(screen.queryByRole('alert')).toBeNull();
    rerender(<Page errors={{ colour: 'Not a field of this record', title: 'Required' }} />);
    expect(within(screen.getByRole('alert')).getAllByRole('listitem').map((li) => li.textContent)).toEqual(['Title: Required', 'Not a field of this record']);
  });
});
