import { compatibilityWarnings, type CompatibilityWarning } from '@toneledger/common/domain/compatibility';
import type { Enclosure, ProcessStep } from '@toneledger/common/schemas/catalogue';

/**
 * The warnings a print would carry with these values, computed in the browser with the same
 * rules the server applies when it saves. The toner classes and after-baths come from the
 * print's process steps (none yet on a new print).
 */
export function previewWarnings(input: {
  process: string;
  enclosureId: string;
  enclosures: Pick<Enclosure, 'id' | 'name' | 'alkalineBuffered' | 'patResult'>[];
  steps: Pick<ProcessStep, 'type' | 'tonerClass' | 'agent' | 'alkaline'>[];
}): CompatibilityWarning[] {
  const enclosure = input.enclosures.find((e) => e.id === input.enclosureId) ?? null;
  const tonerClasses = [...new Set(input.steps.flatMap((s) => (s.type === 'toning' && s.tonerClass ? [s.tonerClass] : [])))];
  const afterBaths = input.steps
    .filter((s) => s.type === 'after_bath')
    .map((s) => ({ solution: s.agent ?? '', alkaline: s.alkaline }));
  return compatibilityWarnings({
    process: input.process,
    tonerClasses,
    afterBaths,
    enclosure: enclosure
      ? { name: enclosure.name, alkalineBuffered: enclosure.alkalineBuffered, patResult: enclosure.patResult }
      : null,
  });
}
