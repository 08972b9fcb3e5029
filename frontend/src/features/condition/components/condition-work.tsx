import { useId } from 'react';
import { Link } from 'react-router-dom';
import { GRADE_LABELS, type ReportSummary } from '@toneledger/common/schemas/condition';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { formatDay, formatDateTime } from '@/lib/format';
import { useConditionWork } from '@/features/condition/api/get-work';

function ReportLine({ report, draft }: { report: ReportSummary; draft: boolean }) {
  return (
    <li className="py-1.5 text-sm">
      <Link to={`/condition/reports/${report.id}`} className="underline">
        <span className="mono">{report.accessionNumber}</span> {report.printTitle}
      </Link>
      <span className="text-ink-700">
        {' '}
        · examined {formatDay(report.examinedOn)}
        {draft ? ` · last changed ${formatDateTime(report.updatedAt)}` : ` · ${report.grade ? GRADE_LABELS[report.grade] : 'no grade'} · ${report.examinerName}`}
      </span>
    </li>
  );
}

function List({ title, reports, empty, draft = false }: { title: string; reports: ReportSummary[]; empty: string; draft?: boolean }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={id} className="text-lg">
        {title}
        {reports.length ? <span className="num ml-2 text-sm font-normal text-ink-700">{reports.length}</span> : null}
      </h2>
      {reports.length === 0 ? (
        <p className="mt-1 text-sm text-ink-700">{empty}</p>
      ) : (
        <ul className="mt-1 divide-y divide-paper-200">
          {reports.map((r) => (
            <ReportLine key={r.id} report={r} draft={draft} />
          ))}
        </ul>
      )}
    </section>
  );
}

/** The condition area opens on the person's own work: drafts to finish, their reports, and the latest by anyone. */
export function ConditionWork({ writer }: { writer: boolean }) {
  const work = useConditionWork();
  if (work.isPending) return <Loading label="Loading your reports…" />;
  if (work.isError) return <ErrorNotice error={work.error} title="Your reports could not be loaded." />;
  const { myDrafts, mySigned, recent } = work.data;
  return (
    <div className="grid gap-5 lg:grid-cols-2">
      {writer ? <List title="Drafts to finish" reports={myDrafts} empty="No drafts: every report you started is signed or discarded." draft /> : null}
      {writer ? <List title="Your recent reports" reports={mySigned} empty="You have not signed a report yet." /> : null}
      <List title="Latest signed reports" reports={recent} empty="No report has been signed yet." />
    </div>
  );
}
