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

/** The file extension of each type `sniffImageType` answers. */
const EXTENSIONS: Record<string, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/tiff': 'tif', 'image/webp': 'webp' };

/**
 * The name an original downloads under: the uploaded name's stem (its last extension dropped; only
 * letters, digits, `.`, `_` and `-`; no leading dots; at most 100 characters; "image" when nothing is
 * left) with the extension of the type the file's bytes showed, so `poly.html` holding a JPEG
 * downloads as `poly.jpg`.
 */
export function downloadName(uploadedName: string, contentType: string): string {
  const base = uploadedName.split(/[/\\]/).pop() ?? '';
  const dot = base.lastIndexOf('.');
  const stem = (dot > 0 ? base.slice(0, dot) : base).replace(/[^A-Za-z0-9._-]/g, '_').replace(/^\.+/, '').slice(0, 100) || 'image';
  return `${stem}.${EXTENSIONS[contentType] ?? 'bin'}`;
}
