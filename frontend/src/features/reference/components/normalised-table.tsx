import type { NormalisedIngredient } from '@toneledger/common/domain/recipes';
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
        <thead className="bg-paper-100 text-xs font-semibold tracking-wide text-ink-700 uppercase">
          <tr>
            <th scope="col" className="px-3 py-2">Chemical</th>
            <th scope="col" className="px-3 py-2">Given as</th>
            <th scope="col" className="px-3 py-2 text-right">Weighed, g/L</th>
            <th scope="col" className="px-3 py-2 text-right">Measured, ml/L</th>
            <th scope="col" className="px-3 py-2 text-right">Pure substance, g/L</th>
          </tr>
        </thead>
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
