import { loansApi } from '@toneledger/common/api/loans';
import { implement, type RouteDef } from '../../http/route';
import { loanChecklistCsv } from '../../services/loan-checklist';
import { changeLoanStatus } from '../../services/loan-status.service';
import {
  addBorrowedPrint, createLoan, listLoans, loanDetail, removeLoanObject, setLoanObjects, updateLoan,
} from '../../services/loan.service';

export function loansRoutes(): RouteDef[] {
  return implement(loansApi, {
    list: async ({ query }) => {
      const { data, total } = await listLoans(query);
      return { data, pagination: { page: query.page, pageSize: query.pageSize, total } };
    },
    create: async ({ body, actor, requestId }) => ({ data: await createLoan(body, actor, requestId) }),
    get: async ({ params, actor }) => ({ data: await loanDetail(params.id, actor.role) }),
    update: async ({ params, body, actor, requestId }) => ({ data: await updateLoan(params.id, body, actor, requestId) }),
    setObjects: async ({ params, body, actor, requestId }) => ({ data: await setLoanObjects(params.id, body, actor, requestId) }),
    removeObject: async ({ params, query, actor, requestId }) => ({ data: await removeLoanObject(params.id, params.printId, query.version, actor, requestId) }),
    addBorrowed: async ({ params, body, actor, requestId }) => ({ data: await addBorrowedPrint(params.id, body, actor, requestId) }),
    changeStatus: async ({ params, body, actor, requestId }) => ({ data: await changeLoanStatus(params.id, body, actor, requestId) }),
    checklistCsv: async ({ params, actor, res }) => {
      const { reference, csv } = await loanChecklistCsv(params.id, actor.role);
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="loan-${reference.replace(/[^A-Za-z0-9._-]/g, '_')}-checklist.csv"`);
      res.end(csv);
    },
  });
}
