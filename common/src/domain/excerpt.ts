/**
 * A short excerpt of a longer text for a list or a timeline: whole words only, at most `max`
 * characters before the ellipsis, never a word cut in half. Word boundaries come from
 * Intl.Segmenter (Unicode UAX #29), so punctuation and any script are handled as the platform does.
 */
export function excerpt(text: string, max = 200): string {
  const clean = text.replace(/\s+/g, ' ').trim();
  if (clean.length <= max) return clean;
  let end = 0;
  for (const s of new Intl.Segmenter('en', { granularity: 'word' }).segment(clean)) {
    const stop = s.index + s.segment.length;
    if (stop > max) break;
    if (s.isWordLike) end = stop;
  }
  // A first word longer than the limit is cut, as nothing shorter can stand for it.
  const cut = end > 0 ? clean.slice(0, end) : clean.slice(0, max);
  return `${cut.replace(/[\s,;:–—-]+$/, '')}…`;
}
