import { describe, expect, it } from 'vitest';
import { actionLabel, auditSentence, formatAuditValue, readableChanges } from './audit-words';

describe('audit actions as sentences', () => {
  it('names the person, what they did and the record', () => {
    const before = { accessionNumber: '1987.14.3', steps: [] };
    expect(auditSentence({ actorName: 'Maren Oakshott', action: 'print.steps_replaced', entityType: 'print', before, after: before })).toBe(
      'Maren Oakshott replaced the process history of print 1987.14.3.',
    );
    expect(auditSentence({ actorName: 'Ivo Lindqvist', action: 'loan.status_changed', entityType: 'loan', before: { status: 'agreed' }, after: { status: 'in_transit' } }, 'loan CR-2031-04')).toBe(
      'Ivo Lindqvist changed the status of loan CR-2031-04 to In transit.',
    );
  });

  it('uses the name the server looked up when the snapshot holds only a place, and the place moved to', () => {
    expect(auditSentence({ actorName: 'Maren Oakshott', action: 'print.moved', entityType: 'print', before: { location: 'Store A' }, after: { location: 'Store B › Drawer 2' } }, 'print 1990.2')).toBe(
      'Maren Oakshott moved print 1990.2 to Store B › Drawer 2.',
    );
  });

  it('says "the system" for an event without a person, and words an unknown code without underscores', () => {
    expect(auditSentence({ actorName: null, action: 'session.signed_in', entityType: 'session', before: null, after: null })).toBe('The system signed in.');
    const s = auditSentence({ actorName: 'Ana Reyes', action: 'shelf_list.rebuilt', entityType: 'shelf_list', before: null, after: null });
    expect(s).toBe('Ana Reyes: shelf list rebuilt.');
    expect(actionLabel('shelf_list.rebuilt')).toBe('Shelf list rebuilt');
    // A record without a name in its snapshot is "a maker", never "the maker a maker".
    expect(auditSentence({ actorName: 'Ana Reyes', action: 'maker.created', entityType: 'maker', before: null, after: { id: 'x' } })).toBe('Ana Reyes added a maker.');
    expect(auditSentence({ actorName: 'Ana Reyes', action: 'maker.created', entityType: 'maker', before: null, after: { name: 'Hollis Brant' } })).toBe('Ana Reyes added the maker Hollis Brant.');
    expect(actionLabel('print.steps_replaced')).toBe('Process history replaced');
  });
});

describe('readable before and after', () => {
  it('labels fields from the field table and shows codes as their labels, never in_store → in_treatment', () => {
    const changes = readableChanges('print', { status: 'in_store', version: 3, imageWidthMm: 240 }, { status: 'in_treatment', version: 4, imageWidthMm: 241 });
    expect(changes).toEqual([
      { field: 'status', label: 'Status', before: 'In store', after: 'In treatment' },
      { field: 'imageWidthMm', label: 'Image width (mm)', before: '240', after: '241' },
    ]);
    for (const c of changes) expect(`${c.label} ${c.before} ${c.after}`).not.toMatch(/_|[{}]/);
  });

  it('writes a process history one step a line with bath times as m:ss, not seconds', () => {
    const steps = [{ type: 'toning', tonerClass: 'selenium', agent: null, recipe: { id: 'x', name: 'Selenium 1+9' }, timeSeconds: 150, temperatureC: 20, extent: 'full' }];
    const [change] = readableChanges('print', { steps: [] }, { steps });
    expect(change.label).toBe('Process history');
    expect(change.before).toBe('none');
    expect(change.after).toMatch(/^1\. Toning, Selenium, Selenium 1\+9, 2:30, 20 °C, Full$/);
    expect(change.after).not.toContain('150');
  });

  it('shows references by name, moments as UTC minutes, yes/no, and never raw JSON', () => {
    expect(formatAuditValue('print', 'location', { id: 'u', pathLabel: 'Store B › Drawer 2' })).toBe('Store B › Drawer 2');
    expect(formatAuditValue('loan', 'signedAt', '2025-03-14T09:05:00.000Z')).toBe('2025-03-14 09:05 UTC');
    expect(formatAuditValue('loan', 'insured', true)).toBe('Yes');
    expect(formatAuditValue('loan', 'conditions', { maxLux: 50, other: null, noAlkalineBufferedMounts: false })).toBe('Max lux: 50; No alkaline buffered mounts: No');
    expect(formatAuditValue('loan', 'status', 'on_loan')).toBe('On loan');
    expect(formatAuditValue('exhibition', 'kind', 'some_new_code')).toBe('some new code');
  });

  it('lists every field with a value when a record is created, and nothing for bookkeeping keys', () => {
    const changes = readableChanges('print', null, { id: 'x', accessionNumber: '1994.12', title: 'Pier', createdAt: '2025-01-01T00:00:00Z' });
    expect(changes.map((c) => c.label)).toEqual(['Accession number', 'Title']);
    expect(changes[0]).toMatchObject({ before: '—', after: '1994.12' });
  });
});
