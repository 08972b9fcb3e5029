import { createReadStream, createWriteStream, type WriteStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { once } from 'node:events';
import path from 'node:path';
import type { Readable, Writable } from 'node:stream';
import { TarWriter } from './tar-writer';

/** A path as a manifest line writes it (RFC 8493 §2.1.3: CR, LF and % percent-encoded). */
export function encodeManifestPath(p: string): string {
  return p.replace(/%/g, '%25').replace(/\r/g, '%0D').replace(/\n/g, '%0A');
}

export function decodeManifestPath(p: string): string {
  return p.replace(/%0D/gi, '\r').replace(/%0A/gi, '\n').replace(/%25/g, '%');
}

/** Tag-file values one per line: no line break may sneak into a value. */
const oneLine = (v: string) => v.replace(/[\r\n]+/g, ' ').trim();

/**
 * A BagIt bag (RFC 8493) written into a tar under one folder, `<root>/`: payload files under
 * `data/` as they come (each hashed on the way, its line kept in a manifest file on disk), then the
 * tag files — `bagit.txt`, `bag-info.txt` with Payload-Oxum, `manifest-sha256.txt` and
 * `tagmanifest-sha256.txt` — at the end.
 */
export class BagWriter {
  private readonly tar: TarWriter;
  private readonly manifest: WriteStream;
  private readonly tagLines: string[] = [];
  octets = 0;
  files = 0;

  constructor(out: Writable, private readonly root: string, private readonly workDir: string) {
    this.tar = new TarWriter(out);
    this.manifest = createWriteStream(path.join(workDir, 'manifest-sha256.txt'));
  }

  get bytesWritten() {
    return this.tar.written;
  }

  /** A payload file: `rel` is its path under `data/`. */
  async addPayload(rel: string, body: Buffer | { stream: Readable; size: number }): Promise<string> {
    const name = `data/${rel}`;
    const sha = Buffer.isBuffer(body) ? await this.tar.addBuffer(`${this.root}/${name}`, body) : await this.tar.addStream(`${this.root}/${name}`, body.size, body.stream);
    this.octets += Buffer.isBuffer(body) ? body.length : body.size;
    this.files += 1;
    if (!this.manifest.write(`${sha}  ${encodeManifestPath(name)}\n`)) await once(this.manifest, 'drain');
    return sha;
  }

  /** A payload file written to disk first (a CSV built batch by batch). */
  async addPayloadFile(rel: string, file: string): Promise<string> {
    const { size } = await stat(file);
    return this.addPayload(rel, { stream: createReadStream(file), size });
  }

  private async addTag(name: string, body: Buffer | { stream: Readable; size: number }) {
    const full = `${this.root}/${name}`;
    const sha = Buffer.isBuffer(body) ? await this.tar.addBuffer(full, body) : await this.tar.addStream(full, body.size, body.stream);
    this.tagLines.push(`${sha}  ${encodeManifestPath(name)}\n`);
  }

  /** The tag files, then the end of the archive. `info` is bag-info.txt's lines after Payload-Oxum and Bagging-Date. */
  async finish(info: [string, string][], baggingDate: string): Promise<{ payloadOxum: string; files: number }> {
    this.manifest.end();
    await once(this.manifest, 'finish');
    const payloadOxum = `${this.octets}.${this.files}`;
    await this.addTag('bagit.txt', Buffer.from('BagIt-Version: 1.0\nTag-File-Character-Encoding: UTF-8\n'));
    const lines = [['Payload-Oxum', payloadOxum], ['Bagging-Date', baggingDate], ...info].map(([k, v]) => `${k}: ${oneLine(v)}\n`);
    await this.addTag('bag-info.txt', Buffer.from(lines.join(''), 'utf8'));
    const manifestFile = path.join(this.workDir, 'manifest-sha256.txt');
    const { size } = await stat(manifestFile);
    await this.addTag('manifest-sha256.txt', { stream: createReadStream(manifestFile), size });
    await this.tar.addBuffer(`${this.root}/tagmanifest-sha256.txt`, Buffer.from(this.tagLines.join(''), 'utf8'));
    await this.tar.finish();
    return { payloadOxum, files: this.files };
  }
}
