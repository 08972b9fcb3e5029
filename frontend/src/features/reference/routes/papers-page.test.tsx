import { describe, expect, it } from 'vitest';
import { fireEvent, screen } from '@testing-library/react';
import type { Paper } from '@toneledger/common/schemas/catalogue';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { page } from '@/features/reference/testing/fixtures';
import { PapersPage } from '@/features/reference/routes/papers-page';

const paper: Paper = {
  id: '88888888-8888-4888-8888-888888888888', label: 'Norland Bromide Velvet', manufacturer: 'Norland', product: 'Bromide Velvet',
  base: 'fibre', surface: 'velvet', baseTint: 'warm white', weight: 'double weight', opticalBrighteners: 'no',
  madeDates: '1955/1968', madeDisplay: '1955 to 1968', notes: null, printCount: 7, version: 1,
};

describe('PapersPage', () => {
  it('reads the manufacture dates as EDTF while they are typed and refuses to save a bad one', async () => {
    const { requests } = mockFetch({
      'GET /api/papers': () => json(page([paper])),
      'POST /api/papers': (request) => json({ data: { ...paper, ...(request.body as object), id: '99999999-9999-4999-8999-999999999999' } }, 201),
    });
    renderPage(<PapersPage />, { path: '/catalogue/papers', me: makeMe('registrar') });
    // The dates as a registrar writes them, the EDTF value in the tooltip.
    expect((await screen.findByText('1955–1968')).getAttribute('title')).toBe('EDTF 1955/1968');
    fireEvent.click(screen.getByRole('button', { name: 'New paper' }));
    fireEvent.change(screen.getByLabelText('Manufacturer'), { target: { value: 'Halden' } });
    fireEvent.change(screen.getByLabelText('Product'), { target: { value: 'Portrait Matt' } });

    const made = screen.getByLabelText('Made (EDTF)');
    fireEvent.change(made, { target: { value: '196X' } });
    expect(screen.getByText('Reads as: 1960s')).toBeTruthy();
    fireEvent.change(made, { target: { value: '1975/1962' } });
    expect(made.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByText('1975/1962: the interval starts after it ends')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(requests.some((r) => r.method === 'POST')).toBe(false);

    fireEvent.change(made, { target: { value: '1962/1975' } });
    expect(screen.getByText('Reads as: 1962 to 1975')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Added paper “Norland Bromide Velvet”.')).toBeTruthy();
    expect(requests.find((r) => r.method === 'POST')?.body).toMatchObject({
      manufacturer: 'Halden', product: 'Portrait Matt', base: 'fibre', opticalBrighteners: 'unknown', madeDates: '1962/1975', surface: null,
    });
  });
});
