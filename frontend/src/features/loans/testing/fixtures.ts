import type { LoanDetail } from '@toneledger/common/schemas/loans';

export const LOAN_ID = '7a1e0c52-4f1b-4c9e-8d2a-1b2c3d4e5f60';
export const PRINT_A = '1f0e2d3c-4b5a-4968-8776-a5b4c3d2e1f0';
export const PRINT_B = '2f0e2d3c-4b5a-4968-8776-a5b4c3d2e1f1';
export const REPORT_A = '3f0e2d3c-4b5a-4968-8776-a5b4c3d2e1f2';

/** An invented loan out from the collection to an invented gallery, with two prints. */
export function makeLoan(overrides: Partial<LoanDetail> = {}): LoanDetail {
  return {
    id: LOAN_ID,
    direction: 'out',
    reference: 'CR-L-2026-004',
    otherInstitution: 'Harrowgate Gallery of Photography',
    contactName: 'Tamsin Quell',
    contactEmail: 'tamsin.quell@example.test',
    purpose: 'exhibition',
    exhibition: null,
    venue: 'Harrowgate, east room',
    dispatchOn: '2026-03-02',
    opensOn: '2026-03-10',
    closesOn: '2026-06-14',
    returnOn: '2026-06-22',
    courier: 'Registrar travels with the crate',
    conditions: {
      maxLux: 50, maxAnnualLuxHours: 12000, temperatureMinC: 18, temperatureMaxC: 22, rhMinPercent: 40, rhMaxPercent: 50,
      noAlkalineBufferedMounts: true, other: null,
    },
    creditLine: 'Lent by Calder Reach',
    notes: null,
    status: 'agreed',
    objectCount: 2,
    version: 3,
    createdAt: '2026-01-05T09:00:00.000Z',
    updatedAt: '2026-02-01T09:00:00.000Z',
    objects: [
      {
        printId: PRINT_A, accessionNumber: '1979.3.12', printTitle: 'Tide mill at dusk', borrowed: false,
        insuranceValue: 4200, currency: 'GBP',
        outgoingReport: { id: REPORT_A, examinedOn: '2026-02-20', grade: 'good' }, returningReport: null, warnings: [],
      },
      {
        printId: PRINT_B, accessionNumber: '1981.7.4', printTitle: 'Blue study of ferns', borrowed: false,
        insuranceValue: 1800, currency: 'GBP', outgoingReport: null, returningReport: null,
        warnings: [{ code: 'light_budget', message: 'This loan would take the print past its light budget for 2026.' }],
      },
    ],
    statusHistory: [
      { from: null, to: 'proposed', on: '2026-01-05', note: null, by: { id: 'a0000000-0000-4000-8000-000000000001', name: 'Ada Marsh' }, at: '2026-01-05T09:00:00.000Z' },
      { from: 'proposed', to: 'approved', on: '2026-01-12', note: 'Approved by the collections committee', by: { id: 'a0000000-0000-4000-8000-000000000001', name: 'Ada Marsh' }, at: '2026-01-12T10:00:00.000Z' },
      { from: 'approved', to: 'agreed', on: '2026-02-01', note: null, by: { id: 'a0000000-0000-4000-8000-000000000001', name: 'Ada Marsh' }, at: '2026-02-01T09:00:00.000Z' },
    ],
    blockers: [{ to: 'in_transit', message: '1 print has no signed outgoing condition report for this loan.', printIds: [PRINT_B] }],
    ...overrides,
  };
}

/** The value as a registrar's answer carries it, taken out as the server does for other roles. */
export function withoutValues(loan: LoanDetail): LoanDetail {
  return { ...loan, objects: loan.objects.map(({ insuranceValue: _v, currency: _c, ...rest }) => rest) };
}
