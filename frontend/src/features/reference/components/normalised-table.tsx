import type { NormalisedIngredient } from '@toneledger/common/domain/recipes';
import { TableHead } from '@/components/ui/table-head';
import { formatQuantity } from '@/features/reference/components/recipe-format';

/**
 * Every ingredient per litre of working bath: what is weighed (g/L) or measured (ml/L), and the
 * pure substance (g/L), e.g. an acid given as a dilute solution counted as pure acid.
 */
export function NormalisedTable({ rows, caption }: { rows: NormalisedIngredient[]; caption: string }) {
  return (
    <div className="overflow-x-auto rounded border border-paper-300 bg-white">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <TableHead
          variant="roomy"
          columns={[
            'Chemical',
            'Given as',
            { label: 'Weighed, g/L', align: 'right' },
            { label: 'Measured, ml/L', align: 'right' },
            { label: 'Pure substance, g/L', align: 'right' },
          ]}
        />
        <tbody>
          {rows.map((row, index) => (
            <tr key={`${index}-${row.chemical}`} className="border-t border-paper-200 align-top">
              <th scope="row" className="px-3 py-2 font-medium text-ink-900">
                {row.chemical}
                {row.note ? <span className="block text-xs font-normal text-ink-700">{row.note}</span> : null}
              </th>
              <td className="px-3 py-2 text-ink-700">{row.givenAs}</td>
              <td className="num px-3 py-2 text-right">{formatQuantity(row.gramsPerLitre)}</td>
              <td className="num px-3 py-2 text-right">{formatQuantity(row.mlPerLitre)}</td>
              <td className="num px-3 py-2 text-right font-semibold">{formatQuantity(row.pureGramsPerLitre)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
