import { useId, useState, type ReactNode } from 'react';
import { can } from '@toneledger/common/domain/roles';
import type { PrintLight } from '@toneledger/common/schemas/light';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { useMe } from '@/lib/auth';
import { useMeasurementSettings } from '@/lib/settings-api';
import { usePrintLight } from '@/features/light/api/print-light';
import { CategoryForm } from '@/features/light/components/category-form';
import { DisplaysTable } from '@/features/light/components/displays-table';
import { ExposureChart } from '@/features/light/components/exposure-chart';
import { LightCostSection } from '@/features/light/components/light-cost';
import { exposureChartData } from '@/features/light/utils/chart-data';
import { budgetText, categoryLabel, categorySourceText, formatLux, formatLuxHours } from '@/features/light/utils/format';

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[10rem_minmax(0,1fr)] gap-2 py-1">
      <dt className="text-ink-700">{term}</dt>
      <dd className="text-ink-900">{children}</dd>
    </div>
  );
}

function Heading({ children }: { children: ReactNode }) {
  return <h3 className="font-sans text-xs font-semibold tracking-wider text-ink-700 uppercase">{children}</h3>;
}

function LightFigures({ light, mayChange, threshold }: { light: PrintLight; mayChange: boolean; threshold: number | null }) {
  const [changing, setChanging] = useState(false);
  const [saved, setSaved] = useState(false);
  const chartNote = useId();
  const chart = exposureChartData(light);
  const annual = light.budget.annualLuxHours;
  return (
    <div className="flex flex-col gap-4">
      <dl className="divide-y divide-paper-200 text-sm">
        <Row term="Category">
          <span className="font-medium">{categoryLabel(light.category)}</span> <span className="text-ink-700">— {categorySourceText(light)}</span>
        </Row>
        <Row term="Budget">
          <span className="num">
            at most {budgetText(light.budget.maxLux, formatLux)}; {budgetText(annual, formatLuxHours)} in any 12 months
          </span>
          <span className="mt-0.5 block text-xs text-ink-700">Source: {light.budgetSource}</span>
        </Row>
        <Row term="Used this year">
          <span className="num">{formatLuxHours(light.usedThisYear)}</span>
        </Row>
        <Row term="Last 12 months">
          <span className="num">{formatLuxHours(light.usedLast12Months)}</span>
        </Row>
        <Row term="Total">
          <span className="num">{formatLuxHours(light.total)}</span>
        </Row>
        <Row term="Planned">
          <span className="num">{formatLuxHours(light.planned)}</span>
        </Row>
        <Row term="Rest">{light.rest.owedUntil ? <span className="font-medium">{light.rest.explanation}</span> : light.rest.explanation}</Row>
      </dl>
      <p className="text-xs text-ink-700">Figures as of {light.asOf}.</p>

      {saved ? (
        <Notice tone="success" role="status">
          Category saved.
        </Notice>
      ) : null}
      {mayChange && !changing ? (
        <div>
          <Button
            size="sm"
            onClick={() => {
              setSaved(false);
              setChanging(true);
            }}
          >
            Change category
          </Button>
        </div>
      ) : null}
      {mayChange && changing ? (
        <CategoryForm
          light={light}
          onDone={(done) => {
            setChanging(false);
            setSaved(done !== null);
          }}
        />
      ) : null}

      {light.warnings.length > 0 ? (
        <Notice tone="warning" title="Light warnings">
          <ul className="list-disc pl-5">
            {light.warnings.map((w) => (
              <li key={w.code + w.message}>{w.message}</li>
            ))}
          </ul>
        </Notice>
      ) : null}

      <div className="flex flex-col gap-1">
        <Heading>Cumulative exposure</Heading>
        {chart ? (
          <>
            <p id={chartNote} className="text-xs text-ink-700">
              {formatLuxHours(light.total)} in total; the dotted line is the annual budget accumulated from the first display.
            </p>
            <ExposureChart data={chart} annualBudget={annual} label="Cumulative lux-hours over time against the budget, with displays shaded" describedBy={chartNote} />
          </>
        ) : (
          <p className="text-sm text-ink-700">No exposure recorded.</p>
        )}
      </div>

      <div className="flex flex-col gap-1">
        <Heading>Displays</Heading>
        <DisplaysTable displays={light.displays} asOf={light.asOf} />
      </div>

      <LightCostSection cost={light.cost} planned={light.planned} threshold={threshold} />
    </div>
  );
}

/**
 * The print page's light panel: category and budget with their sources, exposure figures, the
 * rest owed, warnings, the chart, the displays and the light cost. Shown only to roles that may
 * read light doses; for others it renders nothing and asks nothing.
 */
export function LightPanel({ printId }: { printId: string }) {
  const me = useMe();
  const mayRead = can(me.role, 'light.read');
  const light = usePrintLight(printId, mayRead);
  // The noticeable-change threshold, for whether planned displays would reach it; asked only when there is a cost to weigh.
  const costOk = light.data?.cost.status === 'ok' && light.data.planned > 0;
  const settings = useMeasurementSettings(mayRead && costOk && can(me.role, 'measurements.read'));
  const headingId = useId();
  if (!mayRead) return null;
  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={headingId} className="mb-2 text-lg">
        Light dose
      </h2>
      {light.isPending ? <Loading label="Loading the light dose…" /> : null}
      {light.isError ? <ErrorNotice error={light.error} title="The light dose could not be loaded." /> : null}
      {light.data ? <LightFigures light={light.data} mayChange={can(me.role, 'light.write')} threshold={settings.data?.noticeableDeltaE ?? null} /> : null}
    </section>
  );
}
