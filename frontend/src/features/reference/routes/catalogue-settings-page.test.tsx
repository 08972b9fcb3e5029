import { describe, expect, it } from 'vitest';
import { fireEvent, screen } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { CatalogueSettingsPage } from '@/features/reference/routes/catalogue-settings-page';

const settings = { accessionPattern: 'YYYY.N.N', institutionName: 'Fenwick Photographic Trust' };

function type(field: HTMLElement, value: string) {
  fireEvent.change(field, { target: { value } });
}

describe('CatalogueSettingsPage', () => {
  it('describes the pattern live, and shows a malformed pattern as a field error without saving', async () => {
    const { requests } = mockFetch({ 'GET /api/settings/catalogue': () => json({ data: settings }) });
    renderPage(<CatalogueSettingsPage />, { path: '/catalogue/settings', me: makeMe('admin') });
    const pattern = await screen.findByLabelText('Accession-number pattern');
    expect(screen.getByText('Reads as: a four-digit year, a full stop, a number, a full stop, a number. For example 1987.14.3')).toBeTruthy();

    type(pattern, 'YY.N');
    expect(pattern.getAttribute('aria-invalid')).toBe('true');
    const error = document.getElementById(pattern.getAttribute('aria-describedby')!)!;
    expect(error.textContent).toContain('a year is written YYYY (exactly four Y');
    expect(screen.queryByText(/^Reads as:/)).toBeNull();

    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect((await screen.findByRole('alert')).textContent).toContain('Not saved');
    expect(requests.filter((r) => r.method === 'PUT')).toHaveLength(0);
  });

  it('tries a number against the pattern as typed', async () => {
    mockFetch({ 'GET /api/settings/catalogue': () => json({ data: settings }) });
    renderPage(<CatalogueSettingsPage />, { path: '/catalogue/settings', me: makeMe('admin') });
    const tryBox = await screen.findByLabelText('Try a number');
    type(tryBox, '1987.14.3');
    expect(screen.getByText(/“1987.14.3” fits the pattern/)).toBeTruthy();
    type(tryBox, '87-14');
    expect(screen.getByText(/"87-14" does not match the accession-number pattern YYYY.N.N/)).toBeTruthy();
    type(screen.getByLabelText('Accession-number pattern'), 'PH-####');
    expect(screen.getByText(/Reads as: "PH", a hyphen, 4 digits. For example PH-1234/)).toBeTruthy();
    type(tryBox, 'PH-0042');
    expect(screen.getByText(/“PH-0042” fits the pattern/)).toBeTruthy();
  });

  it('saves both settings, and shows a refusal from the server on its field', async () => {
    let puts = 0;
    const { requests } = mockFetch({
      'GET /api/settings/catalogue': () => json({ data: settings }),
      'PUT /api/settings/catalogue': (request) => {
        puts += 1;
        return puts === 1
          ? errorResponse(400, 'validation_failed', 'Check the settings', { details: [{ path: 'institutionName', message: 'Too similar to the old name', code: 'custom' }] })
          : json({ data: request.body });
      },
    });
    renderPage(<CatalogueSettingsPage />, { path: '/catalogue/settings', me: makeMe('admin') });
    type(await screen.findByLabelText('Accession-number pattern'), 'YYYY-N');
    type(screen.getByLabelText('Institution name'), 'Fenwick Trust');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Too similar to the old name')).toBeTruthy();
    expect(screen.getByLabelText<HTMLInputElement>('Institution name').value).toBe('Fenwick Trust');

    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Settings saved.')).toBeTruthy();
    expect(requests.filter((r) => r.method === 'PUT').map((r) => r.body)).toEqual([
      { accessionPattern: 'YYYY-N', institutionName: 'Fenwick Trust' },
      { accessionPattern: 'YYYY-N', institutionName: 'Fenwick Trust' },
    ]);
  });

  it('is read-only for people who do not manage settings', async () => {
    mockFetch({ 'GET /api/settings/catalogue': () => json({ data: settings }) });
    renderPage(<CatalogueSettingsPage />, { path: '/catalogue/settings', me: makeMe('registrar') });
    const pattern = await screen.findByLabelText<HTMLInputElement>('Accession-number pattern');
    expect(pattern.readOnly).toBe(true);
    expect(screen.queryByRole('button', { name: 'Save' })).toBeNull();
    expect(screen.getByText('Only administrators change these settings.')).toBeTruthy();
  });
});
