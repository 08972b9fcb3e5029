import { useId } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { can, type Role } from '@toneledger/common/domain/roles';
import { CONDITION_CONTEXT_LABELS, GRADE_LABELS } from '@toneledger/common/schemas/condition';
import { exportsApi } from '@toneledger/common/api/exports';
import { Button } from '@/components/ui/button';
import { ExportLinks } from '@/components/ui/export-links';
import { urlOf } from '@/lib/api-client';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { TableHead } from '@/components/ui/table-head';
import { useReports } from '@/features/condition/api/get-reports';
import { formatDay } from '@/features/condition/utils/format';

/** The print's condition reports, newest examination first. */
export function ReportsPanel({ printId, role }: { printId: string; role: Role }) {
  const headingId = useId();
  const navigate = useNavigate();
  const reports = useReports(printId);
  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id={headingId} className="text-lg">
          Condition reports
        </h2>
        {can(role, 'condition.write') ? (
          <Button variant="primary" onClick={() => navigate(`/condition/prints/${printId}/reports/new`)}>
            New condition report
          </Button>
        ) : null}
      </div>
      {reports.data && reports.data.length > 0 ? (
        <div className="mb-3 print:hidden">
          <ExportLinks
            what="this print's condition reports"
            csv={urlOf(exportsApi.conditionReportsCsv, { params: { id: printId } })}
            json={urlOf(exportsApi.conditionReportsJson, { params: { id: printId } })}
            dictionary={urlOf(exportsApi.dictionaryCsv, { params: { name: 'condition-reports' } })}
          />
        </div>
      ) : null}
      {reports.isPending ? <Loading label="Loading reports…" /> : null}
      {reports.isError ? <ErrorNotice error={reports.error} title="The reports could not be loaded." /> : null}
      {reports.data ? (
        reports.data.length === 0 ? (
          <p className="text-sm text-ink-700">No condition reports yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-left text-sm">
              <caption className="sr-only">Condition reports, newest first</caption>
              <TableHead columns={['Examined on', 'Context', 'Grade', 'Status', 'Examiner', 'Addenda']} />
              <tbody>
                {reports.data.map((r) => (
                  <tr key={r.id} className="border-t border-paper-200">
                    <td className="px-2 py-1.5">
                      <Link to={`/condition/reports/${r.id}`}>{formatDay(r.examinedOn)}</Link>
                    </td>
                    <td className="px-2 py-1.5">{CONDITION_CONTEXT_LABELS[r.context]}</td>
                    <td className="px-2 py-1.5">{r.grade ? GRADE_LABELS[r.grade] : <span className="text-ink-600">Not graded</span>}</td>
                    <td className="px-2 py-1.5">
                      {r.status === 'signed' ? 'Signed' : <span className="rounded bg-sepia-50 px-1.5 py-0.5 text-xs font-semibold text-sepia-800">Draft</span>}
                    </td>
                    <td className="px-2 py-1.5">{r.examinerName}</td>
                    <td className="num px-2 py-1.5">{r.addenda.length}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )
      ) : null}
    </section>
  );
}
