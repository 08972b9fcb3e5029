/** How many first bytes of a file `sniffImageType` needs at most. */
export const SIGNATURE_BYTES = 12;

/** The content type from the file's signature; null when it is not an image type we keep. */
export function sniffImageType(head: Buffer): string | null {
  if (head.length >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'image/jpeg';
  if (head.length >= 8 && head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
  if (head.length >= 4 && (head.subarray(0, 4).equals(Buffer.from('II*\0', 'latin1')) || head.subarray(0, 4).equals(Buffer.from('MM\0*', 'latin1')))) return 'image/tiff';
  if (head.length >= 12 && head.subarray(0, 4).toString('latin1') === 'RIFF' && head.subarray(8, 12).toString('latin1') === 'WEBP') return 'image/webp';
  return null;
}
