import { createReadStream, createWriteStream } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { execFileSync } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import { PassThrough, Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import tar from 'tar-stream';
import { checkBag } from './bag-check';
import { BagWriter, decodeManifestPath, encodeManifestPath } from './bag-writer';
import { TarWriter } from './tar-writer';

/**
 * The bag checker against RFC 8493, on bags made by hand with tar-stream (an outside tar writer) and
 * checksums from outside the project: SHA-256("abc") is FIPS 180-2's first example,
 * ba7816bf…f20015ad; SHA-256 of no bytes is e3b0c442…7852b855 (the same standard's function on the
 * empty message, a value every implementation lists).
 */
const SHA_ABC = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';
const SHA_EMPTY = 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855';

async function handmade(files: Record<string, string>): Promise<Readable> {
  const pack = tar.pack();
  for (const [name, body] of Object.entries(files)) pack.entry({ name, size: Buffer.byteLength(body) }, body);
  pack.finalize();
  return Readable.from(pack as unknown as AsyncIterable<Buffer>);
}

const good = {
  'b/bagit.txt': 'BagIt-Version: 1.0\nTag-File-Character-Encoding: UTF-8\n',
  'b/bag-info.txt': 'Payload-Oxum: 3.2\nBagging-Date: 2026-12-02\n',
  'b/data/abc.txt': 'abc',
  'b/data/empty.txt': '',
  'b/manifest-sha256.txt': `${SHA_ABC}  data/abc.txt\n${SHA_EMPTY}  data/empty.txt\n`,
};

describe('the bag checker (RFC 8493)', () => {
  it('passes a correct bag and reads its bag-info', async () => {
    const check = await checkBag(await handmade(good));
    expect(check.problems).toEqual([]);
    expect(check.root).toBe('b');
    expect(check.payloadOctets).toBe(3);
    expect(check.payloadFiles).toBe(2);
    expect(check.info.get('Bagging-Date')).toEqual(['2026-12-02']);
  });

  it('names a payload file whose bytes no longer match its manifest line', async () => {
    const check = await checkBag(await handmade({ ...good, 'b/data/abc.txt': 'abd' }));
    expect(check.problems).toEqual([{ path: 'data/abc.txt', message: expect.stringMatching(/^Checksum mismatch: manifest-sha256.txt says ba7816bf/) }]);
  });

  it('finds a wrong Payload-Oxum, a missing file, an unlisted file and a malformed bagit.txt', async () => {
    expect((await checkBag(await handmade({ ...good, 'b/bag-info.txt': 'Payload-Oxum: 4.2\n' }))).problems)
      .toEqual([{ path: 'bag-info.txt', message: 'Payload-Oxum says 4 bytes in 2 files; the payload holds 3 bytes in 2 files' }]);
    const { 'b/data/empty.txt': _gone, ...missing } = good;
    const lost = await checkBag(await handmade({ ...missing, 'b/bag-info.txt': 'Payload-Oxum: 3.1\n' }));
    expect(lost.problems).toEqual([{ path: 'data/empty.txt', message: 'manifest-sha256.txt lists this file but the bag does not hold it' }]);
    const extra = await checkBag(await handmade({ ...good, 'b/data/extra.txt': '', 'b/bag-info.txt': 'Payload-Oxum: 3.3\n' }));
    expect(extra.problems).toEqual([{ path: 'data/extra.txt', message: 'This payload file is not listed in manifest-sha256.txt' }]);
    const bad = await checkBag(await handmade({ ...good, 'b/bagit.txt': 'BagIt-Version: one\nTag-File-Character-Encoding: UTF-8\n' }));
    expect(bad.problems.map((p) => p.path)).toEqual(['bagit.txt']);
    const none = await checkBag(await handmade({ 'b/data/abc.txt': 'abc' }));
    expect(none.problems.map((p) => p.message)).toEqual(['The bag declaration bagit.txt is missing', 'The bag has no payload manifest']);
  });

  it('refuses a path that leaves the bag', async () => {
    const check = await checkBag(await handmade({ ...good, 'b/data/../../evil.txt': 'x' }));
    expect(check.problems.some((p) => p.path === 'b/data/../../evil.txt')).toBe(true);
  });

  it('percent-encodes CR, LF and % in manifest paths and reads them back (RFC 8493 §2.1.3)', () => {
    expect(encodeManifestPath('data/a%b\nc\rd')).toBe('data/a%25b%0Ac%0Dd');
    expect(decodeManifestPath('data/a%25b%0Ac%0Dd')).toBe('data/a%b\nc\rd');
  });
});

describe('the bag writer', () => {
  let dir: string;
  beforeAll(async () => {
    dir = await mkdtemp(path.join(os.tmpdir(), 'toneledger-bagw-'));
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  it('writes a tar GNU tar extracts byte for byte, names past 100 and 255 bytes included, and a bag the checker passes', async () => {
    const file = path.join(dir, 'w.tar');
    const bag = new BagWriter(createWriteStream(file), 'root', dir);
    const long = `prints/${'x'.repeat(120)}/${'y'.repeat(90)}.json`;
    const longer = `prints/${'z'.repeat(200)}/${'w'.repeat(200)}.json`;
    await bag.addPayload('abc.txt', Buffer.from('abc'));
    await bag.addPayload(long, Buffer.from('{"a":1}\n'));
    await bag.addPayload(longer, { stream: Readable.from([Buffer.from('é'), Buffer.from('t')]), size: 3 });
    const done = await bag.finish([['Source-Organization', 'Calder Reach\nInjected: line']], '2026-12-02');
    expect(done).toEqual({ payloadOxum: `${3 + 8 + 3}.3`, files: 3 });
    const out = path.join(dir, 'x');
    execFileSync('mkdir', ['-p', out]);
    execFileSync('tar', ['-xf', file, '-C', out]);
    expect(execFileSync('cat', [path.join(out, 'root/data', long)]).toString()).toBe('{"a":1}\n');
    expect(execFileSync('cat', [path.join(out, 'root/data', longer)]).toString()).toBe('ét');
    expect(execFileSync('sha256sum', [path.join(out, 'root/data/abc.txt')]).toString().split(' ')[0]).toBe(SHA_ABC);
    const info = execFileSync('cat', [path.join(out, 'root/bag-info.txt')]).toString();
    expect(info).toBe(`Payload-Oxum: 14.3\nBagging-Date: 2026-12-02\nSource-Organization: Calder Reach Injected: line\n`);
    const check = await checkBag(createReadStream(file));
    expect(check.problems).toEqual([]);
  });

  it('refuses a stream that gives fewer bytes than announced', async () => {
    const tarw = new TarWriter(new PassThrough().resume());
    await expect(tarw.addStream('a', 10, Readable.from([Buffer.from('short')]))).rejects.toThrow('expected 10 bytes');
  });
});
