import type { RoundDetail, WorklistItem } from '@toneledger/common/schemas/inspections';

export const ROUND_ID = '8c2d0e61-5a2b-4d0f-9e3b-2c3d4e5f6a71';
export const CONSERVATOR_ID = '5d0c0f5e-8a7b-4c2d-9e1f-112233445566';
export const PRINTS = ['4a0e2d3c-4b5a-4968-8776-a5b4c3d2e101', '4a0e2d3c-4b5a-4968-8776-a5b4c3d2e102', '4a0e2d3c-4b5a-4968-8776-a5b4c3d2e103', '4a0e2d3c-4b5a-4968-8776-a5b4c3d2e104'];
export const REPORT_ID = '9d3e1f72-6b3c-4e1a-8f4c-3d4e5f6a7b82';

/** An invented print due for a check in an invented store room. */
export function makeItem(n: number, overrides: Partial<WorklistItem> = {}): WorklistItem {
  return {
    printId: PRINTS[n]!, accessionNumber: `1984.7.${n + 1}`, title: `Quarry at noon ${n + 1}`, dueOn: '2026-11-20', overdueDays: 12, risk: 'high',
    overridden: false, mainReason: 'iron-blue print in a buffered folder', reasons: ['vulnerable_process', 'enclosure'],
    locationId: 'b1e2d3c4-0000-4000-8000-000000000001', locationLabel: 'North store › Cabinet 4 › Drawer 2', lastGrade: 'fair',
    lastCheckedOn: '2023-05-02', round: null, ...overrides,
  };
}

export function worklistPage(items: WorklistItem[], total = items.length) {
  return { data: items, pagination: { page: 1, pageSize: 50, total }, counts: { overdue: 3, within30: 7, within90: 12, total: 40 } };
}

export function makeRound(overrides: Partial<RoundDetail> = {}): RoundDetail {
  return {
    id: ROUND_ID, title: 'Checks in Drawer 2', plannedOn: '2026-12-09', status: 'planned',
    assignee: { id: CONSERVATOR_ID, name: 'Iris Penhale', email: 'iris.penhale@example.test' }, notes: null, printCount: 2, checkedCount: 1,
    locationLabel: 'North store › Cabinet 4 › Drawer 2', createdBy: { id: CONSERVATOR_ID, name: 'Iris Penhale' }, createdAt: '2026-12-01T10:00:00.000Z',
    version: 2,
    items: [
      {
        printId: PRINTS[0]!, accessionNumber: '1984.7.1', title: 'Quarry at noon 1', locationLabel: 'North store › Cabinet 4 › Drawer 2', lastGrade: 'fair',
        lastCheckedOn: '2023-05-02', dueOn: '2026-11-20', lookAt: ['iron-blue print in a buffered folder', 'Silver mirroring, slight, at the edge (recto)'],
        checkedOn: null, conditionReportId: null,
      },
      {
        printId: PRINTS[1]!, accessionNumber: '1984.7.2', title: null, locationLabel: 'North store › Cabinet 4 › Drawer 2', lastGrade: 'good',
        lastCheckedOn: '2026-12-02', dueOn: '2029-12-02', lookAt: [], checkedOn: '2026-12-02', conditionReportId: REPORT_ID,
      },
    ],
    ...overrides,
  };
}
