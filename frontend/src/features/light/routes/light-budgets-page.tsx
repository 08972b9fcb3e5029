import { Link } from 'react-router-dom';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { TableHead } from '@/components/ui/table-head';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useOverBudget } from '@/features/light/api/print-light';
import { budgetText, categoryLabel, formatLuxHours } from '@/features/light/utils/format';

const CELL = 'px-2 py-1.5 align-top';

/** The prints whose displays, as planned, would take them past their light budget or maximum illuminance. */
export function LightBudgetsPage() {
  useDocumentTitle('Light budgets');
  const list = useOverBudget();
  return (
    <section>
      <PageHeader
        title="Light budgets"
        description={
          <>
            Prints whose displays, as planned, would exceed their annual light budget or their maximum illuminance. The budgets and the
            default categories are in the <Link to="/catalogue/light-settings">light settings</Link>.
          </>
        }
      />
      {list.isPending ? <Loading label="Loading the prints…" /> : null}
      {list.isError ? <ErrorNotice error={list.error} title="The list could not be loaded." /> : null}
      {list.data ? (
        list.data.length === 0 ? (
          <p className="text-sm text-ink-700">No print's planned displays exceed its budget.</p>
        ) : (
          <div className="overflow-x-auto rounded border border-paper-300 bg-white">
            <table className="w-full text-sm">
              <caption className="sr-only">Prints over their light budget</caption>
              <TableHead
                columns={[
                  'Print',
                  'Category',
                  { label: 'Annual budget', align: 'right' },
                  { label: 'Used this year', align: 'right' },
                  { label: 'Planned', align: 'right' },
                  'Warnings',
                ]}
              />
              <tbody className="divide-y divide-paper-200">
                {list.data.map((item) => (
                  <tr key={item.printId}>
                    <td className={CELL}>
                      <Link to={`/catalogue/prints/${item.printId}`} className="mono">
                        {item.accessionNumber}
                      </Link>
                      <span className="block text-ink-800">{item.printTitle}</span>
                    </td>
                    <td className={CELL}>{categoryLabel(item.category)}</td>
                    <td className={`${CELL} num text-right whitespace-nowrap`}>{budgetText(item.annualLuxHours, formatLuxHours)}</td>
                    <td className={`${CELL} num text-right whitespace-nowrap`}>{formatLuxHours(item.usedThisYear)}</td>
                    <td className={`${CELL} num text-right whitespace-nowrap`}>{formatLuxHours(item.planned)}</td>
                    <td className={CELL}>
                      <ul className="list-disc pl-4">
                        {item.warnings.map((w) => (
                          <li key={w.code + w.message}>{w.message}</li>
                        ))}
                      </ul>
                    </td>
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
