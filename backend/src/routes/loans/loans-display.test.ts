import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testApp } from '../../../test/app';
import { exhibitionClient } from '../../../test/exhibition-helpers';

/**
 * A loan out for an exhibition leaves only with each print approved for display in that exhibition
 * by a conservator (DEVELOPERS.md, Loans): waiting, refused or not on the object list is a 409
 * naming the prints, listed beforehand in the loan's blockers. Other loans are not held by it.
 */

const t = testApp();
let x: Awaited<ReturnType<typeof exhibitionClient>>;
beforeAll(async () => {
  x = await exhibitionClient(t);
});
afterAll(() => t.close());

let refSeq = 0;
const ref = () => `LD-${Date.now().toString(36)}-${++refSeq}`;
const today = () => new Date().toISOString().slice(0, 10);

interface Detail { id: string; version: number; status: string; blockers: { to: string; message: string; printIds: string[] }[] }

async function agreedLoan(printIds: string[], body: Record<string, unknown>) {
  const made = await x.as('registrar').post('/api/loans', {
    direction: 'out', reference: ref(), otherInstitution: 'Pellow Quay Gallery', purpose: 'exhibition', venue: 'Pellow Quay, upper room',
    dispatchOn: '2033-03-01', opensOn: '2033-03-10', closesOn: '2033-06-10', returnOn: '2033-06-20', ...body,
  });
  expect(made.status, JSON.stringify(made.body)).toBe(201);
  let loan = made.body.data as Detail;
  const put = await x.as('registrar').put(`/api/loans/${loan.id}/objects`, { objects: printIds.map((printId) => ({ printId })), version: loan.version });
  expect(put.status, JSON.stringify(put.body)).toBe(200);
  loan = put.body.data;
  for (const to of ['approved', 'agreed']) loan = await stepOk(loan, to);
  return loan;
}

const step = (loan: Detail, to: string) => x.as('registrar').post(`/api/loans/${loan.id}/status`, { to, version: loan.version });
async function stepOk(loan: Detail, to: string) {
  const res = await step(loan, to);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data as Detail;
}
const fresh = async (loan: Detail) => (await x.as('registrar').get(`/api/loans/${loan.id}`)).body.data as Detail;

async function signedOutgoing(printId: string, loanId: string) {
  const draft = await x.as('conservator').post(`/api/prints/${printId}/condition-reports`, { examinedOn: today(), context: 'outgoing_loan', grade: 'good', loanId });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  const signed = await x.as('conservator').post(`/api/condition-reports/${draft.body.data.id}/sign`, { version: draft.body.data.version });
  expect(signed.status, JSON.stringify(signed.body)).toBe(200);
}

async function decide(exhibitionId: string, printId: string, decision: 'approved' | 'refused', reason?: string) {
  const res = await x.as('conservator').put(`/api/exhibitions/${exhibitionId}/objects/${printId}/approval`, { decision, ...(reason ? { reason } : {}) });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

describe('loans out for an exhibition: approval for display before dispatch', () => {
  it('blocked while waiting for a conservator, blocked when refused, leaves once approved', async () => {
    const [a, b] = [await x.newPrint(), await x.newPrint()];
    const ex = await x.newExhibition([{ name: 'Pellow Quay Gallery', opensOn: '2033-03-10', closesOn: '2033-06-10' }]);
    await x.addObjects(ex, [a.id, b.id]);
    let loan = await agreedLoan([a.id, b.id], { exhibitionId: ex.id });
    await signedOutgoing(a.id, loan.id);
    await signedOutgoing(b.id, loan.id);

    // Both waiting: named in the blockers before anyone tries, and the dispatch is refused.
    loan = await fresh(loan);
    const waiting = `2 prints are not approved for display in ${ex.title} by a conservator.`;
    expect(loan.blockers).toEqual([{ to: 'in_transit', message: waiting, printIds: [a.id, b.id] }]);
    let res = await step(loan, 'in_transit');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe(waiting);
    expect(res.body.error.details.printIds).toEqual([a.id, b.id]);

    // One approved, one refused: the refused one alone holds the loan, in words of its own.
    await decide(ex.id, a.id, 'approved');
    await decide(ex.id, b.id, 'refused', 'Foxing along the lower edge; not fit to be shown.');
    loan = await fresh(loan);
    const refused = `1 print was refused for display in ${ex.title} by a conservator.`;
    expect(loan.blockers).toEqual([{ to: 'in_transit', message: refused, printIds: [b.id] }]);
    res = await step(loan, 'in_transit');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe(refused);
    expect(res.body.error.details.printIds).toEqual([b.id]);
    expect((await fresh(loan)).status).toBe('agreed');

    // The conservator changes the decision: the loan leaves.
    await decide(ex.id, b.id, 'approved');
    loan = await fresh(loan);
    expect(loan.blockers).toEqual([]);
    loan = await stepOk(loan, 'in_transit');
    expect(loan.status).toBe('in_transit');
  });

  it('a print not on the object list holds the loan; missing reports and approvals are named together', async () => {
    const [a, b] = [await x.newPrint(), await x.newPrint()];
    const ex = await x.newExhibition([{ name: 'Pellow Quay Gallery', opensOn: '2033-03-10', closesOn: '2033-06-10' }]);
    await x.addObjects(ex, [a.id]);
    let loan = await agreedLoan([a.id, b.id], { exhibitionId: ex.id });
    const reports = '2 prints have no signed outgoing condition report for this loan.';
    const notListed = `1 print is not on the object list of ${ex.title}.`;
    const waiting = `1 print is not approved for display in ${ex.title} by a conservator.`;
    expect(loan.blockers).toEqual([
      { to: 'in_transit', message: reports, printIds: [a.id, b.id] },
      { to: 'in_transit', message: notListed, printIds: [b.id] },
      { to: 'in_transit', message: waiting, printIds: [a.id] },
    ]);
    const res = await step(loan, 'in_transit');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe(`${reports} ${notListed} ${waiting}`);
    expect(res.body.error.details.printIds).toEqual([a.id, b.id]);

    await signedOutgoing(a.id, loan.id);
    await signedOutgoing(b.id, loan.id);
    await decide(ex.id, a.id, 'approved');
    loan = await fresh(loan);
    expect(loan.blockers).toEqual([{ to: 'in_transit', message: notListed, printIds: [b.id] }]);
    await x.addObjects(ex, [b.id]);
    await decide(ex.id, b.id, 'approved');
    loan = await stepOk(await fresh(loan), 'in_transit');
    expect(loan.status).toBe('in_transit');
  });

  it('a loan without an exhibition, or for research, leaves on its signed reports alone', async () => {
    const [a, b, c] = [await x.newPrint(), await x.newPrint(), await x.newPrint()];
    const ex = await x.newExhibition([{ name: 'Pellow Quay Gallery', opensOn: '2033-03-10', closesOn: '2033-06-10' }]);
    await x.addObjects(ex, [a.id, b.id, c.id]); // all three waiting for a conservator
    const noExhibition = await agreedLoan([a.id], {});
    const research = await agreedLoan([b.id], { purpose: 'research', exhibitionId: ex.id, dispatchOn: '2035-03-01', opensOn: null, closesOn: null, returnOn: '2035-04-01' });
    for (const [loan, print] of [[noExhibition, a], [research, b]] as const) {
      await signedOutgoing(print.id, loan.id);
      const now = await fresh(loan);
      expect(now.blockers).toEqual([]);
      expect((await stepOk(now, 'in_transit')).status).toBe('in_transit');
    }
  });
});
