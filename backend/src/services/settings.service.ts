import type { CatalogueSettings } from '@toneledger/common/schemas/catalogue';
import { DEFAULT_ACCESSION_PATTERN, accessionRule } from '@toneledger/common/domain/accession';
import { Setting } from '../models';
import { db } from '../db';
import { validationFailed } from '../errors';
import { recordAudit, type AuditActor } from './audit.service';

const KEY = 'catalogue';
export const DEFAULT_CATALOGUE_SETTINGS: CatalogueSettings = {
  accessionPattern: DEFAULT_ACCESSION_PATTERN,
  institutionName: 'Your institution',
};

export async function getCatalogueSettings(): Promise<CatalogueSettings> {
  const row = await Setting.findByPk(KEY);
  return { ...DEFAULT_CATALOGUE_SETTINGS, ...((row?.value as Partial<CatalogueSettings>) ?? {}) };
}

const warned = new Set<string>();

/** A stored pattern that is not applied (unsafe to run, see `checkAccession`) is reported once per pattern. */
export function warnUncheckedPattern(pattern: string, unchecked: string | undefined): void {
  if (!unchecked || warned.has(pattern)) return;
  warned.add(pattern);
  process.emitWarning(`${unchecked} Accession numbers are not checked until an administrator changes it in the catalogue settings.`, {
    code: 'TONELEDGER_ACCESSION_PATTERN_NOT_APPLIED',
  });
}

export async function putCatalogueSettings(next: CatalogueSettings, actor: AuditActor, requestId: string | null): Promise<CatalogueSettings> {
  try {
    accessionRule(next.accessionPattern);
  } catch (err) {
    throw validationFailed([{ path: 'accessionPattern', message: (err as Error).message, code: 'custom' }]);
  }
  return db().transaction(async (t) => {
    const before = await getCatalogueSettings();
    await Setting.upsert({ key: KEY, value: next }, { transaction: t });
    await recordAudit({ actor, action: 'settings.updated', entityType: 'settings', entityId: KEY, before, after: next, requestId }, t);
    return next;
  });
}
