/** Words of the compact list. */

/** A location path ("Calder Reach › Store B › Cabinet 3 › Drawer 4") as its last two levels ("Cabinet 3 › Drawer 4"). */
export function lastLevels(pathLabel: string, levels = 2): string {
  const parts = pathLabel.split(' › ');
  return parts.length <= levels ? pathLabel : parts.slice(-levels).join(' › ');
}

/** A title short enough for one line of the compact list, cut at a word with "…" (the full title is on hover). */
export function shortTitle(title: string, max = 44): string {
  if (title.length <= max) return title;
  const cut = title.slice(0, max - 1);
  const space = cut.lastIndexOf(' ');
  return `${(space > max * 0.6 ? cut.slice(0, space) : cut).replace(/[\s,.;:–-]+$/, '')}…`;
}
