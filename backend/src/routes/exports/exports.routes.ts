import type { Response } from 'express';
import { exportsApi } from '@toneledger/common/api/exports';
import { implement, type RouteDef } from '../../http/route';
import { checkReadingsQuery, writeReadingsCsv, writeReadingsJson } from '../../services/exports/readings-export';
import {
  conditionReportsJson, movementsJson, writeConditionReportsCsv, writeLoansCsv, writeLoansJson, writeMovementsCsv,
} from '../../services/exports/record-exports';
import { exportDictionary, exportDictionaryCsv } from '../../services/exports/dictionaries';
import { loadPrint } from '../../services/print.service';
import { fileSafe } from '../../services/exports/columns';

const today = () => new Date().toISOString().slice(0, 10);

function download(res: Response, type: 'csv' | 'json', name: string) {
  res.setHeader('Content-Type', type === 'csv' ? 'text/csv; charset=utf-8' : 'application/json; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${fileSafe(name)}-${today()}.${type}"`);
}

/** The accession number for a file name; a 404 before anything is written when the print is not there. */
async function printLabel(id: string) {
  return (await loadPrint(id)).accessionNumber;
}

export function exportsRoutes(): RouteDef[] {
  return implement(exportsApi, {
    conditionReportsCsv: async ({ params, res }) => {
      download(res, 'csv', `condition-reports-${await printLabel(params.id)}`);
      await writeConditionReportsCsv(params.id, res);
      res.end();
    },
    conditionReportsJson: async ({ params, res }) => {
      const doc = await conditionReportsJson(params.id);
      download(res, 'json', `condition-reports-${doc.print.accessionNumber}`);
      res.send(JSON.stringify(doc));
    },
    readingsCsv: async ({ query, res }) => {
      await checkReadingsQuery(query);
      download(res, 'csv', query.printId ? `readings-${await printLabel(query.printId)}` : 'readings');
      await writeReadingsCsv(query, res);
      res.end();
    },
    readingsJson: async ({ query, res }) => {
      await checkReadingsQuery(query);
      download(res, 'json', query.printId ? `readings-${await printLabel(query.printId)}` : 'readings');
      await writeReadingsJson(query, res);
      res.end();
    },
    movementsCsv: async ({ params, res }) => {
      download(res, 'csv', `movements-${await printLabel(params.id)}`);
      await writeMovementsCsv(params.id, res);
      res.end();
    },
    movementsJson: async ({ params, res }) => {
      const doc = await movementsJson(params.id);
      download(res, 'json', `movements-${doc.print.accessionNumber}`);
      res.send(JSON.stringify(doc));
    },
    loansCsv: async ({ query, res }) => {
      download(res, 'csv', 'loans');
      await writeLoansCsv(query, res);
      res.end();
    },
    loansJson: async ({ query, actor, res }) => {
      download(res, 'json', 'loans');
      await writeLoansJson(query, actor.role, res);
      res.end();
    },
    dictionary: ({ params }) => ({ data: exportDictionary(params.name) }),
    dictionaryCsv: ({ params, res }) => {
      download(res, 'csv', `${params.name}-dictionary`);
      res.send(exportDictionaryCsv(params.name));
    },
  });
}
