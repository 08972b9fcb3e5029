import type { ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';

export const EXHIBITION_ID = '8b2f1d63-5a2c-4d0f-9e3b-2c3d4e5f6a71';
export const VENUE_ID = '8b2f1d63-5a2c-4d0f-9e3b-2c3d4e5f6a72';
export const PRINT_ID = '8b2f1d63-5a2c-4d0f-9e3b-2c3d4e5f6a73';
export const DISPLAY_ID = '8b2f1d63-5a2c-4d0f-9e3b-2c3d4e5f6a74';

/** An invented in-house rotation with one iron-blue print on its list, waiting for a conservator. */
export function makeExhibition(overrides: Partial<ExhibitionDetail> = {}): ExhibitionDetail {
  return {
    id: EXHIBITION_ID,
    title: 'Blue hours: toned prints from the river archive',
    organiser: 'Calder Reach',
    summary: null,
    venues: [{ id: VENUE_ID, name: 'Print room', place: 'Calder Reach', opensOn: '2026-04-01', closesOn: '2026-06-30' }],
    opensOn: '2026-04-01',
    closesOn: '2026-06-30',
    objectCount: 1,
    version: 2,
    createdAt: '2026-01-10T09:00:00.000Z',
    updatedAt: '2026-01-10T09:00:00.000Z',
    objects: [
      {
        printId: PRINT_ID, accessionNumber: '1981.7.4', printTitle: 'Blue study of ferns', thumbnailUrl: null, lightResponsivity: 'high',
        approval: 'pending', approvalReason: null, approvedBy: null, approvedAt: null,
        displays: [],
        luxHours: 0, budgetLeftLuxHours: 12000, expectedDeltaE00: null, warnings: [],
      },
    ],
    ...overrides,
  };
}
