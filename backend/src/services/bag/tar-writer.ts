import { createHash } from 'node:crypto';
import { once } from 'node:events';
import type { Readable, Writable } from 'node:stream';

/**
 * A POSIX tar (ustar, with a pax header for names longer than ustar holds) written entry by entry
 * to a stream, waiting for the stream to drain so nothing piles up in memory. Each entry's size is
 * known before its bytes; the SHA-256 of its bytes is returned.
 */
export class TarWriter {
  written = 0;
  constructor(private readonly out: Writable) {}

  private async put(chunk: Buffer): Promise<void> {
    this.written += chunk.length;
    if (!this.out.write(chunk)) await once(this.out, 'drain');
  }

  /** An entry whose bytes are in hand. */
  async addBuffer(name: string, body: Buffer, mtime = new Date()): Promise<string> {
    await this.header(name, body.length, mtime);
    await this.put(body);
    await this.pad(body.length);
    return createHash('sha256').update(body).digest('hex');
  }

  /** An entry read from a stream that must give exactly `size` bytes. */
  async addStream(name: string, size: number, body: Readable, mtime = new Date()): Promise<string> {
    await this.header(name, size, mtime);
    const hash = createHash('sha256');
    let seen = 0;
    for await (const chunk of body as AsyncIterable<Buffer>) {
      seen += chunk.length;
      if (seen > size) break;
      hash.update(chunk);
      await this.put(chunk);
    }
    if (seen !== size) throw new Error(`${name}: expected ${size} bytes, the source gave ${seen > size ? 'more' : seen}`);
    await this.pad(size);
    return hash.digest('hex');
  }

  /** Two zero blocks end the archive. */
  async finish(): Promise<void> {
    await this.put(Buffer.alloc(1024));
    this.out.end();
    await once(this.out, 'finish');
  }

  private async pad(size: number) {
    const rest = size % 512;
    if (rest) await this.put(Buffer.alloc(512 - rest));
  }

  private async header(name: string, size: number, mtime: Date) {
    const bytes = Buffer.byteLength(name);
    const split = bytes > 100 ? splitUstar(name) : { prefix: '', name };
    if (!split) {
      // A pax extended header carries the whole name (POSIX.1-2001).
      const record = paxRecord('path', name);
      await this.block(`PaxHeader/${name.slice(-80).replace(/^\/+/, '')}`.slice(0, 100), '', record.length, mtime, 'x');
      await this.put(record);
      await this.pad(record.length);
      await this.block(name.slice(0, 100), '', size, mtime, '0');
      return;
    }
    await this.block(split.name, split.prefix, size, mtime, '0');
  }

  private async block(name: string, prefix: string, size: number, mtime: Date, type: string) {
    const h = Buffer.alloc(512);
    h.write(name, 0, 100, 'utf8');
    h.write('0000644\0', 100, 'ascii');
    h.write('0000000\0', 108, 'ascii');
    h.write('0000000\0', 116, 'ascii');
    h.write(`${size.toString(8).padStart(11, '0')}\0`, 124, 'ascii');
    h.write(`${Math.floor(mtime.getTime() / 1000).toString(8).padStart(11, '0')}\0`, 136, 'ascii');
    h.write('        ', 148, 'ascii');
    h.write(type, 156, 'ascii');
    h.write('ustar\0', 257, 'ascii');
    h.write('00', 263, 'ascii');
    h.write(prefix, 345, 155, 'utf8');
    let sum = 0;
    for (const b of h) sum += b;
    h.write(`${sum.toString(8).padStart(6, '0')}\0 `, 148, 'ascii');
    await this.put(h);
  }
}

/** ustar's name (100 bytes) and prefix (155 bytes), split at a slash, or null when the name does not fit. */
function splitUstar(path: string): { prefix: string; name: string } | null {
  for (let i = path.indexOf('/'); i > 0; i = path.indexOf('/', i + 1)) {
    const prefix = path.slice(0, i);
    const name = path.slice(i + 1);
    if (Buffer.byteLength(prefix) <= 155 && Buffer.byteLength(name) <= 100) return { prefix, name };
  }
  return null;
}

/** "<length> <key>=<value>\n", where the length counts the whole record, its own digits included. */
function paxRecord(key: string, value: string): Buffer {
  const body = ` ${key}=${value}\n`;
  let len = Buffer.byteLength(body);
  while (String(len).length + Buffer.byteLength(body) !== len) len = String(len).length + Buffer.byteLength(body);
  return Buffer.from(`${len}${body}`);
}
