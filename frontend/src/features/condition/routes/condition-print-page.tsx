import { Link, useParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { Loading } from '@/components/ui/loading';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrint } from '@/lib/prints-api';
import { CompareChooser } from '@/features/condition/components/compare-chooser';
import { ImagesPanel } from '@/features/condition/components/images-panel';
import { PrintIdentityLine } from '@/features/condition/components/print-identity-line';
import { ReportsPanel } from '@/features/condition/components/reports-panel';
import { NotLoaded } from '@/features/condition/routes/print-not-loaded';

/** One print's condition: its reports, its images, and the way into comparing them. */
export function ConditionPrintPage() {
  const { id = '' } = useParams();
  const me = useMe();
  const print = usePrint(id);
  useDocumentTitle(print.data ? `Condition of ${print.data.accessionNumber}` : 'Condition');
  if (print.isPending) return <Loading label="Loading the print…" />;
  if (print.isError) return <NotLoaded error={print.error} what="print" />;
  const p = print.data;
  return (
    <article>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        {can(me.role, 'condition.read') ? <Link to="/condition">Condition</Link> : <Link to={`/catalogue/prints/${p.id}`}>Catalogue record</Link>}{' '}
        <span aria-hidden="true">›</span> <span className="mono">{p.accessionNumber}</span>
      </nav>
      <div className="mb-5 flex flex-wrap items-end justify-between gap-3 border-b border-paper-300 pb-4">
        <PrintIdentityLine print={p} />
        <div className="flex flex-wrap gap-4">
          {can(me.role, 'condition.read') ? <Link to={`/condition/treatments?print=${p.id}`}>Treatments of this print</Link> : null}
          {can(me.role, 'treatments.write') && p.status !== 'deaccessioned' ? <Link to={`/condition/prints/${p.id}/treatments/new`}>Propose a treatment</Link> : null}
          <Link to={`/catalogue/prints/${p.id}`}>Catalogue record</Link>
        </div>
      </div>
      <div className="flex flex-col gap-5">
        {can(me.role, 'condition.read') ? <ReportsPanel printId={p.id} role={me.role} /> : null}
        <ImagesPanel printId={p.id} role={me.role} />
        <CompareChooser printId={p.id} />
      </div>
    </article>
  );
}
