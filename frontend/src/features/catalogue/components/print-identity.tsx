import type { ReactNode } from 'react';
import type { Print } from '@toneledger/common/schemas/catalogue';
import { LIGHT_RESPONSIVITY, PAT_RESULT, PROCESS, STATUS, SUPPORT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { edtfAsWritten } from '@toneledger/common/domain/edtf-words';
import { formatDimensions } from '@/features/catalogue/utils/format';

const none = <span className="text-ink-600">Not recorded</span>;

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[10rem_1fr] gap-3 border-b border-paper-200 py-1.5 last:border-b-0">
      <dt className="text-xs font-semibold tracking-wide text-ink-700 uppercase">{term}</dt>
      <dd className="text-sm text-ink-900">{children}</dd>
    </div>
  );
}

function buffering(value: boolean | null): string {
  if (value === true) return 'alkaline-buffered';
  if (value === false) return 'unbuffered';
  return 'buffering unknown';
}

/** What the print is: identity, making, materials, size, status and enclosure. */
export function PrintIdentity({ print }: { print: Print }) {
  const image = formatDimensions(print.imageHeightMm, print.imageWidthMm);
  const sheet = formatDimensions(print.sheetHeightMm, print.sheetWidthMm);
  const mount = formatDimensions(print.mountHeightMm, print.mountWidthMm);
  return (
    <dl className="rounded border border-paper-300 bg-white px-4 py-2">
      <Row term="Accession number">
        <span className="mono">{print.accessionNumber}</span>
      </Row>
      <Row term="Title">{print.title}</Row>
      <Row term="Maker">{print.maker?.name ?? none}</Row>
      <Row term="Date made">
        {print.dateMade ? (
          <>
            <span title={`EDTF ${print.dateMade}`}>{edtfAsWritten(print.dateMade)}</span>{' '}
            <details className="inline-block align-top text-xs text-ink-700">
              <summary className="cursor-pointer underline">EDTF</summary>
              <code className="mono">{print.dateMade}</code> · {print.dateDisplay}
            </details>
          </>
        ) : (
          none
        )}
      </Row>
      <Row term="Process">{PROCESS.labels[print.process]}</Row>
      <Row term="Support">{print.support ? SUPPORT.labels[print.support] : none}</Row>
      <Row term="Paper">{print.paper?.label ?? none}</Row>
      <Row term="Toners">{print.tonerClasses.length ? print.tonerClasses.map((t) => TONER_CLASS.labels[t]).join(', ') : 'None recorded'}</Row>
      <Row term="Dimensions (h × w)">
        {image || sheet || mount ? (
          <ul className="num">
            {image ? <li>Image {image}</li> : null}
            {sheet ? <li>Sheet {sheet}</li> : null}
            {mount ? <li>Mount {mount}</li> : null}
          </ul>
        ) : (
          none
        )}
      </Row>
      <Row term="Status">{STATUS.labels[print.status]}</Row>
      <Row term="Light responsivity">{print.lightResponsivity ? LIGHT_RESPONSIVITY.labels[print.lightResponsivity] : none}</Row>
      <Row term="Enclosure">
        {print.enclosure ? (
          <>
            {print.enclosure.name}
            <span className="block text-ink-700">
              {buffering(print.enclosure.alkalineBuffered)}; Photographic Activity Test: {PAT_RESULT.labels[print.enclosure.patResult].toLowerCase()}
            </span>
          </>
        ) : (
          none
        )}
      </Row>
    </dl>
  );
}
