import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';
import tar from 'tar-stream';
import type { BagProblem } from '@toneledger/common/schemas/preservation';
import { decodeManifestPath } from './bag-writer';

/** Tag files kept whole in memory while checking (the payload is only hashed). */
const TAG_FILE = /^(bagit\.txt|bag-info\.txt|(tag)?manifest-[a-z0-9]+\.txt)$/;
const HASHES: Record<string, string> = { sha256: 'sha256', sha512: 'sha512', sha1: 'sha1', md5: 'md5' };

export interface BagCheck {
  problems: BagProblem[];
  /** bag-info.txt's fields (a repeated label keeps its values in order). */
  info: Map<string, string[]>;
  /** The folder the bag lies in inside the tar ('' when at the top). */
  root: string;
  payloadFiles: number;
  payloadOctets: number;
}

/** An entry's bytes: iterate them, or `resume()` to skip them. */
export type EntryBody = AsyncIterable<Buffer> & { resume(): unknown };

/** Reads every entry of a tar (tar-stream); `onEntry` gets its path and its bytes, which it must consume. */
export async function readTar(source: Readable, onEntry: (name: string, size: number, body: EntryBody) => Promise<void>): Promise<void> {
  const extract = tar.extract();
  const done = new Promise<void>((resolve, reject) => {
    extract.on('entry', (header, stream, next) => {
      if (header.type !== 'file') {
        stream.resume();
        stream.on('end', next);
        return;
      }
      onEntry(header.name, header.size ?? 0, stream as unknown as EntryBody).then(() => next(), (err) => {
        stream.resume();
        extract.destroy(err);
      });
    });
    extract.on('finish', resolve);
    extract.on('close', resolve);
    extract.on('error', reject);
  });
  source.on('error', (err) => extract.destroy(err));
  source.pipe(extract);
  await done;
}

/**
 * Checks a bag in a tar against RFC 8493: `bagit.txt` present and well formed (BagIt-Version M.N and
 * Tag-File-Character-Encoding), at least one payload manifest, every manifest line's checksum equal to
 * the file's own and every file it names present, every payload file listed in every payload
 * manifest, Payload-Oxum (octets.count) equal to the payload, tag manifests' lines equal to the tag
 * files, and no path that leaves the bag. Every problem names its file.
 */
export async function checkBag(source: Readable): Promise<BagCheck> {
  const problems: BagProblem[] = [];
  const tags = new Map<string, Buffer>();
  /** Every file: its hashes by algorithm, filled for the algorithms the manifests use (sha256 always). */
  const files = new Map<string, { size: number; sha256: string; others?: Record<string, string> }>();
  let root: string | null = null;

  await readTar(source, async (name, size, body) => {
    const slash = name.indexOf('/');
    const top = slash < 0 ? '' : name.slice(0, slash);
    if (root === null) root = top;
    const rel = root === '' ? name : name.slice(root.length + 1);
    if (root !== '' && !name.startsWith(`${root}/`)) {
      problems.push({ path: name, message: 'This file lies outside the bag\'s folder' });
      body.resume();
      return;
    }
    if (rel.split('/').some((part) => part === '..' || part === '') || rel.startsWith('/')) {
      problems.push({ path: name, message: 'This path leaves the bag or is not a plain relative path' });
      body.resume();
      return;
    }
    const hash = createHash('sha256');
    const others = { sha512: createHash('sha512'), sha1: createHash('sha1'), md5: createHash('md5') };
    const keep: Buffer[] | null = TAG_FILE.test(rel) ? [] : null;
    for await (const chunk of body) {
      hash.update(chunk);
      if (keep) {
        keep.push(chunk);
        for (const h of Object.values(others)) h.update(chunk);
      }
    }
    if (keep) tags.set(rel, Buffer.concat(keep));
    files.set(rel, { size, sha256: hash.digest('hex'), others: keep ? Object.fromEntries(Object.entries(others).map(([k, h]) => [k, h.digest('hex')])) : undefined });
  });

  const bagit = tags.get('bagit.txt');
  if (!bagit) problems.push({ path: 'bagit.txt', message: 'The bag declaration bagit.txt is missing' });
  else {
    const lines = bagit.toString('utf8').split(/\r\n|\n|\r/).filter((l) => l !== '');
    if (!/^BagIt-Version: [0-9]+\.[0-9]+$/.test(lines[0] ?? '')) problems.push({ path: 'bagit.txt', message: 'The first line must be "BagIt-Version: M.N"' });
    if (!/^Tag-File-Character-Encoding: \S+$/.test(lines[1] ?? '')) problems.push({ path: 'bagit.txt', message: 'The second line must be "Tag-File-Character-Encoding: <encoding>"' });
    if (lines.length !== 2) problems.push({ path: 'bagit.txt', message: 'bagit.txt holds exactly two lines' });
  }

  const info = parseInfo(tags.get('bag-info.txt'));
  const payload = [...files.entries()].filter(([p]) => p.startsWith('data/'));
  const payloadOctets = payload.reduce((s, [, f]) => s + f.size, 0);
  const oxum = info.get('Payload-Oxum')?.[0];
  if (oxum !== undefined) {
    const m = /^([0-9]+)\.([0-9]+)$/.exec(oxum);
    if (!m) problems.push({ path: 'bag-info.txt', message: `Payload-Oxum "${oxum}" is not octets.count` });
    else if (Number(m[1]) !== payloadOctets || Number(m[2]) !== payload.length) {
      problems.push({ path: 'bag-info.txt', message: `Payload-Oxum says ${m[1]} bytes in ${m[2]} files; the payload holds ${payloadOctets} bytes in ${payload.length} files` });
    }
  }

  const manifests = [...tags.keys()].filter((p) => /^manifest-[a-z0-9]+\.txt$/.test(p));
  if (!manifests.length) problems.push({ path: 'manifest-sha256.txt', message: 'The bag has no payload manifest' });
  for (const manifest of manifests) {
    const listed = checkManifest(manifest, tags.get(manifest)!, files, problems);
    for (const [p] of payload) if (!listed.has(p)) problems.push({ path: p, message: `This payload file is not listed in ${manifest}` });
  }
  for (const manifest of [...tags.keys()].filter((p) => /^tagmanifest-[a-z0-9]+\.txt$/.test(p))) {
    const listed = checkManifest(manifest, tags.get(manifest)!, files, problems);
    for (const p of listed) if (p.startsWith('data/')) problems.push({ path: p, message: `${manifest} lists a payload file` });
  }
  return { problems, info, root: root ?? '', payloadFiles: payload.length, payloadOctets };
}

/** Checks each line of a manifest; returns the paths it lists. */
function checkManifest(
  manifest: string, text: Buffer, files: Map<string, { sha256: string; others?: Record<string, string> }>, problems: BagProblem[],
): Set<string> {
  const algorithm = /^(?:tag)?manifest-([a-z0-9]+)\.txt$/.exec(manifest)![1];
  const listed = new Set<string>();
  if (!HASHES[algorithm]) {
    problems.push({ path: manifest, message: `The checksum algorithm ${algorithm} is not one this checker knows` });
    return listed;
  }
  const lines = text.toString('utf8').split(/\r\n|\n|\r/).filter((l) => l !== '');
  for (const [i, line] of lines.entries()) {
    const m = /^([0-9a-fA-F]+)[ \t]+(.+)$/.exec(line);
    if (!m) {
      problems.push({ path: manifest, message: `Line ${i + 1} is not "<checksum> <path>"` });
      continue;
    }
    const p = decodeManifestPath(m[2].replace(/^\*/, ''));
    listed.add(p);
    const file = files.get(p);
    if (!file) {
      problems.push({ path: p, message: `${manifest} lists this file but the bag does not hold it` });
      continue;
    }
    const actual = algorithm === 'sha256' ? file.sha256 : file.others?.[algorithm];
    if (actual === undefined) problems.push({ path: p, message: `Only tag files are checked with ${algorithm}; add a manifest-sha256.txt` });
    else if (actual !== m[1].toLowerCase()) problems.push({ path: p, message: `Checksum mismatch: ${manifest} says ${m[1].toLowerCase()}, the file's ${algorithm} is ${actual}` });
  }
  return listed;
}

/** bag-info.txt: "Label: value" lines; a line starting with white space continues the one before. */
export function parseInfo(text: Buffer | undefined): Map<string, string[]> {
  const info = new Map<string, string[]>();
  if (!text) return info;
  let last: { label: string; index: number } | null = null;
  for (const line of text.toString('utf8').split(/\r\n|\n|\r/)) {
    if (/^[ \t]/.test(line) && last) {
      const values = info.get(last.label)!;
      values[last.index] += ` ${line.trim()}`;
      continue;
    }
    const m = /^([^:]+):\s?(.*)$/.exec(line);
    if (!m) continue;
    const values = info.get(m[1]) ?? [];
    values.push(m[2]);
    info.set(m[1], values);
    last = { label: m[1], index: values.length - 1 };
  }
  return info;
}
