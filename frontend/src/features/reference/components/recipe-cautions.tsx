import { useId } from 'react';

interface Caution {
  code: string;
  text: string;
}

/** Cautions that name a specific danger of this recipe rather than general good practice. */
const SERIOUS = new Set(['ferricyanide_acid_heat', 'ferricyanide_with_strong_acid', 'acetic_acid_concentrated']);

export const PRECEDENCE_NOTE =
  "These cautions are general reminders, not a risk assessment. The safety data sheets, local regulations and your institution's health-and-safety practice take precedence.";

/** The safety cautions of a recipe, shown before anything else about mixing it. */
export function RecipeCautions({ cautions, live = false }: { cautions: Caution[]; live?: boolean }) {
  const headingId = useId();
  const isSerious = (code: string) => SERIOUS.has(code) || code.startsWith('chemical_');
  const serious = cautions.filter((c) => isSerious(c.code));
  const general = cautions.filter((c) => !isSerious(c.code));
  return (
    <section aria-labelledby={headingId} className="rounded border-2 border-sepia-700 bg-sepia-50 px-4 py-3 text-sm text-ink-900">
      <h2 id={headingId} className="flex items-center gap-2 font-sans text-base font-semibold text-sepia-800">
        <span aria-hidden="true">⚠</span> Safety cautions{live ? <span className="text-xs font-normal text-ink-700">(updated as you type)</span> : null}
      </h2>
      <p className="mt-1 font-semibold text-sepia-800">{PRECEDENCE_NOTE}</p>
      <div aria-live={live ? 'polite' : undefined}>
        {serious.length > 0 ? (
          <ul className="mt-2 flex flex-col gap-1.5">
            {serious.map((c) => (
              <li key={c.code} data-caution={c.code} className="rounded border border-danger-200 bg-danger-50 px-2.5 py-1.5 font-medium text-danger-700">
                {c.text}
              </li>
            ))}
          </ul>
        ) : null}
        {general.length > 0 ? (
          <ul className="mt-2 list-disc pl-5">
            {general.map((c) => (
              <li key={c.code} data-caution={c.code}>
                {c.text}
              </li>
            ))}
          </ul>
        ) : null}
      </div>
    </section>
  );
}
