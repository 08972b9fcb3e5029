import { Notice } from '@/components/ui/notice';

export const BUFFERED_NOTE =
  'Buffered enclosures are unsuitable for cyanotypes and iron-blue toned prints: the blue pigment is alkali-sensitive and fades or is destroyed by alkali.';

export const BUFFERED_HELP =
  'Buffered paper or board carries an alkaline reserve (usually calcium carbonate) that neutralises acids. ' +
  "Yes: buffered. No: unbuffered. Unknown: the supplier's data does not say.";

export const PAT_HELP =
  'The Photographic Activity Test (ISO 18916) checks whether an enclosure material causes fading or staining in photographic images. ' +
  'ISO 18902 asks enclosure materials for photographs to pass it. Choose "Not tested" when there is no test report.';

/** The visible caution carried by every buffered enclosure type. */
export function BufferedNote({ compact = false }: { compact?: boolean }) {
  if (compact) {
    return (
      <span className="mt-0.5 block text-xs font-medium text-sepia-800">
        <span aria-hidden="true">⚠ </span>Not for cyanotypes or iron-blue toned prints (alkali-sensitive).
      </span>
    );
  }
  return (
    <Notice tone="warning" title="Buffered">
      <p>{BUFFERED_NOTE}</p>
    </Notice>
  );
}
