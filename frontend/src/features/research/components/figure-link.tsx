import type { ReactNode } from 'react';
import type { PrintsAsk } from '@/features/research/api/keys';

/** Asks the page to list the prints behind a figure, with a title saying which. */
export type ShowPrints = (ask: PrintsAsk, title: string) => void;

/** A figure that opens the prints behind it. */
export function FigureLink({ onShow, ask, title, children }: { onShow: ShowPrints; ask: PrintsAsk; title: string; children: ReactNode }) {
  return (
    <button type="button" className="num text-iron-700 underline decoration-dotted underline-offset-2 hover:decoration-solid" title={`The prints: ${title}`} onClick={() => onShow(ask, title)}>
      {children}
    </button>
  );
}

/** Series colours on screen (the print stylesheet keeps them, in grey where needed). */
export const SERIES = ['#1f4b75', '#9a2b1d', '#3d6b35', '#7a4d8c', '#8a6a12', '#2f6f73', '#5b5b5b', '#b0532a'];
