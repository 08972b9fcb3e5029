import { randomUUID } from 'node:crypto';
import type { Role } from '@toneledger/common/domain/roles';
import { User } from '../src/models';

/** A user provisioned straight in the database, unique per call. */
export async function createUser(overrides: Partial<{ role: Role; name: string; email: string | null }> = {}): Promise<User> {
  const tag = randomUUID().slice(0, 8);
  return User.create({
    issuer: 'https://idp.test.invalid',
    subject: `factory-${tag}`,
    email: overrides.email === undefined ? `person-${tag}@test.example` : overrides.email,
    name: overrides.name ?? `Test Person ${tag}`,
    role: overrides.role ?? 'viewer',
    lastSignInAt: null,
  });
}

import { EnclosureType, Location, Maker, Paper, BathRecipe } from '../src/models';

const tag = () => randomUUID().slice(0, 8);

/** A unique accession number in the default pattern YYYY.N.N. */
let seq = 0;
export function accession(): string {
  seq += 1;
  return `2099.${(Date.now() % 100000) + seq}.${Math.floor(Math.random() * 1000) + 1}`;
}

export async function createMaker(name = `Maker ${tag()}`) {
  return Maker.create({ name, lifeDates: null, notes: null });
}

export async function createPaper(overrides: Partial<{ manufacturer: string; product: string; surface: string | null; base: 'fibre' | 'rc' | 'other' }> = {}) {
  return Paper.create({
    manufacturer: overrides.manufacturer ?? `Mill ${tag()}`, product: overrides.product ?? 'Bromide Grade 2', base: overrides.base ?? 'fibre',
    surface: overrides.surface ?? 'glossy', baseTint: null, weight: 'double weight', opticalBrighteners: 'unknown', madeDates: null,
    madeEarliest: null, madeLatest: null, notes: null,
  });
}

export async function createEnclosure(overrides: Partial<{ name: string; alkalineBuffered: boolean | null; patResult: 'passed' | 'failed' | 'not_tested' }> = {}) {
  return EnclosureType.create({
    name: overrides.name ?? `Folder ${tag()}`, material: 'paper', alkalineBuffered: overrides.alkalineBuffered === undefined ? false : overrides.alkalineBuffered,
    patResult: overrides.patResult ?? 'passed', notes: null,
  });
}

export async function createLocation(name = `Room ${tag()}`, parent?: Location) {
  return Location.create({ name, kind: parent ? 'box' : 'building', parentId: parent?.id ?? null, code: null, notes: null, pathLabel: parent ? `${parent.pathLabel} › ${name}` : name });
}

export async function createRecipe(name = `Toner ${tag()}`) {
  return BathRecipe.create({
    name, tonerClass: 'iron_blue', volumeMl: 500, mixingNotes: null,
    ingredients: [
      { chemical: 'ferric ammonium citrate', amount: 4, unit: 'g' },
      { chemical: 'potassium ferricyanide', amount: 4, unit: 'g' },
      { chemical: 'acetic acid', amount: 130, unit: 'g', strengthPercent: 28 },
    ],
  });
}

import { Image } from '../src/models';

/** An image row for a print (no stored file): enough for records that point at an image. */
export async function createImageRecord(printId: string, overrides: Partial<{ withdrawnAt: Date | null; viewType: string }> = {}) {
  const id = randomUUID();
  return Image.create({
    id, printId, viewType: overrides.viewType ?? 'recto', capturedOn: null, notes: null, fileName: `${id}.tif`, contentType: 'image/tiff',
    sizeBytes: 1024, width: 4000, height: 5000, sha256: '0'.repeat(64), originalKey: `originals/${id}`, thumbKey: null, screenKey: null,
    exif: {}, uploadedBy: null, uploadedByName: null, withdrawnAt: overrides.withdrawnAt ?? null, withdrawnByName: null,
    withdrawnReason: null, purgeAfter: null, purgedAt: null,
  });
}
