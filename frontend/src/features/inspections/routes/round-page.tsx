import { Link, useParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import type { RoundDetail } from '@toneledger/common/schemas/inspections';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PrintArea } from '@/components/ui/print-area';
import { useMe } from '@/lib/auth';
import { formatDay } from '@/lib/format';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useRound, useUpdateRound } from '@/features/inspections/api/rounds';
import { RoundSheet } from '@/features/inspections/components/round-sheet';
import { ROUND_STATUS_LABELS } from '@/features/inspections/components/rounds-table';

/** The browser's print dialog; a seam so tests can see it was asked for. */
export const sheetPrinter = {
  print(): void {
    window.print();
  },
};

function RoundView({ round }: { round: RoundDetail }) {
  const me = useMe();
  const planner = can(me.role, 'schedule.write');
  const update = useUpdateRound(round.id);
  const setStatus = (status: RoundDetail['status']) => update.mutate({ status, version: round.version });
  return (
    <article className="flex flex-col gap-4">
      <nav aria-label="Breadcrumb" className="text-sm print:hidden">
        <Link to="/inspections">Inspections</Link> <span aria-hidden="true">›</span> <Link to="/inspections/rounds">Rounds</Link>
      </nav>
      <PrintArea className="flex flex-col gap-4">
        <div className="flex flex-wrap items-end justify-between gap-3 border-b border-paper-300 pb-3">
          <div className="min-w-0">
            <h1 className="text-2xl sm:text-[1.75rem]">{round.title}</h1>
            <p className="mt-1 text-sm text-ink-700">
              {formatDay(round.plannedOn)} · {round.assignee.name} · {round.locationLabel ?? 'several places'} · {ROUND_STATUS_LABELS[round.status]} ·{' '}
              <span data-testid="round-progress">
                {round.checkedCount} of {round.printCount} checked
              </span>
            </p>
            {round.notes ? <p className="mt-2 text-sm whitespace-pre-line">{round.notes}</p> : null}
          </div>
          <div className="flex flex-wrap gap-2 print:hidden">
            <Button onClick={() => sheetPrinter.print()}>Print the sheet</Button>
            {planner && round.status === 'planned' ? (
              <>
                <Button onClick={() => setStatus('done')} disabled={update.isPending}>
                  Mark done
                </Button>
                <Button variant="quiet" onClick={() => setStatus('cancelled')} disabled={update.isPending}>
                  Cancel the round
                </Button>
              </>
            ) : null}
          </div>
        </div>
        {update.isError ? <ErrorNotice error={update.error} title="The round was not changed." /> : null}
        <RoundSheet round={round} canCheck={can(me.role, 'condition.write')} />
      </PrintArea>
    </article>
  );
}

/** One round: its prints in shelf order with what to look at, a printable sheet, and each print's check. */
export function RoundPage() {
  const { id = '' } = useParams();
  const round = useRound(id);
  useDocumentTitle(round.data ? round.data.title : 'Inspection round');
  if (round.isPending) return <Loading label="Loading the round…" />;
  if (round.isError) return <ErrorNotice error={round.error} title="The round could not be loaded." />;
  return <RoundView round={round.data} />;
}
