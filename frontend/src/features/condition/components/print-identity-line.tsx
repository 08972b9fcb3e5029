import type { Print } from '@toneledger/common/schemas/catalogue';
import { PROCESS, TONER_CLASS } from '@toneledger/common/schemas/vocab';

/** Which print this is, in one line: accession number, title, process, toners, warnings. */
export function PrintIdentityLine({ print, level = 'h1' }: { print: Print; level?: 'h1' | 'p' }) {
  const Heading = level;
  const toners = print.tonerClasses.length ? print.tonerClasses.map((t) => TONER_CLASS.labels[t]).join(', ') : 'no toner recorded';
  const warnings = print.warnings.length;
  return (
    <div className="min-w-0">
      <Heading className={level === 'h1' ? 'mono text-2xl sm:text-[1.75rem]' : 'mono text-lg font-semibold'}>{print.accessionNumber}</Heading>
      <p className="mt-0.5 font-serif text-lg text-ink-900">{print.title}</p>
      <p className="mt-0.5 text-sm text-ink-700">
        {PROCESS.labels[print.process]} · {toners} ·{' '}
        <span className={warnings ? 'font-semibold text-danger-700' : undefined}>
          {warnings === 0 ? 'no warnings' : `${warnings} ${warnings === 1 ? 'warning' : 'warnings'}`}
        </span>
      </p>
    </div>
  );
}
