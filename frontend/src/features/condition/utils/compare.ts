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
