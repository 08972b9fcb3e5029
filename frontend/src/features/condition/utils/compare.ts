import type { PrintImage } from '@toneledger/common/schemas/images';

/** When an image was made: its capture date, else the day it was uploaded. */
export function captureKey(image: PrintImage): string {
  return image.capturedOn ?? image.uploadedAt.slice(0, 10);
}

export function byCapture(a: PrintImage, b: PrintImage): number {
  return captureKey(a).localeCompare(captureKey(b)) || a.uploadedAt.localeCompare(b.uploadedAt);
}

/** The earliest and the latest of a set of images of one view, or null when there are fewer than two. */
export function defaultPair(images: PrintImage[]): [PrintImage, PrintImage] | null {
  if (images.length < 2) return null;
  const sorted = [...images].sort(byCapture);
  return [sorted[0]!, sorted[sorted.length - 1]!];
}

/**
 * The pair after one side is chosen. Both sides show one view: choosing an earlier image of another
 * view (raking light, say) moves the later side to an image of that view (the latest one after it,
 * else the latest other one), or empties it when there is none, so the two lists stay of one view.
 */
export function choosePair(images: PrintImage[], which: 'a' | 'b', id: string, current: [string, string]): [string, string] {
  const [a, b] = which === 'a' ? [id, current[1]] : [current[0], id];
  if (which === 'b') return [a, b];
  const chosen = images.find((i) => i.id === a);
  const other = images.find((i) => i.id === b);
  if (!chosen || (other && other.viewType === chosen.viewType && other.id !== chosen.id)) return [a, b];
  const sameView = images.filter((i) => i.viewType === chosen.viewType && i.id !== chosen.id).sort(byCapture);
  const after = sameView.filter((i) => byCapture(i, chosen) > 0);
  const next = after.at(-1) ?? sameView.at(-1);
  return [a, next?.id ?? ''];
}

/** A warning when the "earlier" image was made after the "later" one; null when the order is right. */
export function orderWarning(a: PrintImage | undefined, b: PrintImage | undefined): string | null {
  if (!a || !b || byCapture(a, b) <= 0) return null;
  return `The earlier image (${captureKey(a)}) was made after the later one (${captureKey(b)}): the change shown runs backwards.`;
}
