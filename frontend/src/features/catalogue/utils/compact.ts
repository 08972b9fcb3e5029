/** Words of the compact list. */

/** A location path ("Calder Reach › Store B › Cabinet 3 › Drawer 4") as its last two levels ("Cabinet 3 › Drawer 4"). */
export function lastLevels(pathLabel: string, levels = 2): string {
  const parts = pathLabel.split(' › ');
  return parts.length <= levels ? pathLabel : parts.slice(-levels).join(' › ');
}

/** A text short enough for one line of the compact list, cut at a word with "…" (the full text is on hover). */
export function shortTitle(title: string, max = 34): string {
  if (title.length <= max) return title;
  const cut = title.slice(0, max - 1);
  const space = cut.lastIndexOf(' ');
  return `${(space > max * 0.6 ? cut.slice(0, space) : cut).replace(/[\s,.;:–-]+$/, '')}…`;
}

/** A vocabulary label without its gloss in brackets: "Iron blue (Prussian blue)" → "Iron blue". */
export function bareLabel(label: string): string {
  return label.replace(/\s*\([^)]*\)$/, '');
}

/**
 * Process names as the trade abbreviates them in a dense list: developing-out and printing-out
 * paper as DOP and POP (common practice); the full name is on hover.
 */
export const COMPACT_PROCESS: Record<string, string> = {
  gelatin_silver_developing_out: 'Gelatin silver DOP',
  gelatin_silver_printing_out: 'Gelatin silver POP',
};
