import { createReadStream, createWriteStream } from 'node:fs';
import { pipeline } from 'node:stream/promises';
import tar from 'tar-stream';

/**
 * Copies a tar entry by entry through tar-stream, letting `change` replace a file's bytes (or drop the
 * file with null): tests make tampered bags with it.
 */
export async function retar(from: string, to: string, change: (name: string, body: Buffer) => Buffer | null): Promise<void> {
  const extract = tar.extract();
  const pack = tar.pack();
  extract.on('entry', (header, stream, next) => {
    const parts: Buffer[] = [];
    stream.on('data', (c: unknown) => { parts.push(c as Buffer); });
    stream.on('end', () => {
      const body = header.type === 'file' ? change(header.name, Buffer.concat(parts)) : Buffer.concat(parts);
      if (body === null) return next();
      pack.entry({ ...header, size: body.length }, body, next);
    });
  });
  extract.on('finish', () => pack.finalize());
  await Promise.all([pipeline(createReadStream(from), extract), pipeline(pack, createWriteStream(to))]);
}
