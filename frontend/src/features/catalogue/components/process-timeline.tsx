import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { ProcessStep } from '@toneledger/common/schemas/catalogue';
import { STEP_TYPE, THIOSULFATE_METHOD, TONER_CLASS, TONING_EXTENT } from '@toneledger/common/schemas/vocab';
import { formatSeconds, yesNoUnknown } from '@/features/catalogue/utils/format';
import { AGENT_LABELS } from '@/features/catalogue/utils/steps';

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex gap-1.5">
      <dt className="text-ink-600">{term}</dt>
      <dd className="text-ink-900">{children}</dd>
    </div>
  );
}

function StepFacts({ step }: { step: ProcessStep }) {
  const facts: ReactNode[] = [];
  if (step.type === 'toning' && step.tonerClass) facts.push(<Fact key="toner" term="Toner">{TONER_CLASS.labels[step.tonerClass]}</Fact>);
  if (step.recipe) {
    facts.push(
      <Fact key="recipe" term="Recipe">
        <Link to={`/catalogue/recipes/${step.recipe.id}`}>{step.recipe.name}</Link>
      </Fact>,
    );
  }
  if (step.agent) facts.push(<Fact key="agent" term={AGENT_LABELS[step.type]}>{step.agent}</Fact>);
  if (step.dilution) facts.push(<Fact key="dilution" term="Dilution">{step.dilution}</Fact>);
  if (step.concentration) facts.push(<Fact key="concentration" term="Concentration">{step.concentration}</Fact>);
  if (step.timeSeconds !== null) {
    facts.push(
      <Fact key="time" term="Time">
        <span className="num" title={`${step.timeSeconds} s`}>
          {formatSeconds(step.timeSeconds)}
        </span>
      </Fact>,
    );
  }
  if (step.temperatureC !== null) facts.push(<Fact key="temp" term="Temperature"><span className="num">{step.temperatureC} °C</span></Fact>);
  if (step.extent) facts.push(<Fact key="extent" term="Extent">{TONING_EXTENT.labels[step.extent]}</Fact>);
  if (step.type === 'after_bath') facts.push(<Fact key="alkaline" term="Alkaline">{yesNoUnknown(step.alkaline)}</Fact>);
  if (step.method) facts.push(<Fact key="method" term="Method">{THIOSULFATE_METHOD.labels[step.method]}</Fact>);
  if (step.value !== null) {
    facts.push(
      <Fact key="value" term="Result">
        <span className="num">
          {step.value}
          {step.unit ? ` ${step.unit}` : ''}
        </span>
      </Fact>,
    );
  }
  if (facts.length === 0) return null;
  return <dl className="mt-1 flex flex-wrap gap-x-4 gap-y-0.5 text-sm">{facts}</dl>;
}

/** The process history as an ordered vertical timeline, first step at the top. */
export function ProcessTimeline({ steps }: { steps: ProcessStep[] }) {
  if (steps.length === 0) return <p className="text-sm text-ink-700">No process steps are recorded.</p>;
  const ordered = [...steps].sort((a, b) => a.position - b.position);
  return (
    <ol className="relative flex flex-col gap-0 border-l-2 border-paper-300 pl-5">
      {ordered.map((step, index) => (
        <li key={step.id} className="relative pb-4 last:pb-0">
          <span
            aria-hidden="true"
            className={`absolute top-1 -left-[1.72rem] size-3 rounded-full border-2 border-white ${
              step.type === 'toning' ? 'bg-iron-700' : step.type === 'residual_thiosulfate_test' ? 'bg-ok-700' : 'bg-sepia-700'
            }`}
          />
          <p className="text-sm font-semibold text-ink-900">
            <span className="num mr-2 text-ink-600">{index + 1}.</span>
            {STEP_TYPE.labels[step.type]}
          </p>
          <StepFacts step={step} />
          {step.notes ? <p className="mt-1 text-sm whitespace-pre-line text-ink-800">{step.notes}</p> : null}
        </li>
      ))}
    </ol>
  );
}
