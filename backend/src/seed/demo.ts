import { QueryTypes, type Sequelize } from 'sequelize';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { env } from '../config/env';
import { Setting, User } from '../models';
import { recordAudit } from '../services/audit.service';
import { DEMO_ACCOUNTS } from './demo-accounts';
import { seedDemoProceduresIfEmpty } from './demo-procedures';
import { seedDemoCatalogue } from './demo-catalogue';
import { seedDemoClimate } from './demo-climate';
import { seedDemoCondition } from './demo-condition';
import { seedDemoLoans } from './demo-loans';
import { seedDemoMeasurements } from './demo-measurements';
import { seedDemoSchedules } from './demo-schedule';

export interface SeedDemoOptions {
  /**
   * Also build the demo catalogue (a few hundred prints) when the catalogue is empty. By default
   * only in development: the shared test database keeps an empty catalogue for the API tests.
   */
  catalogue?: boolean;
  /**
   * Also build the demo condition histories (reports and photographs), measurement histories, and
   * exhibitions and loans when those tables are empty. Follows `catalogue` by default (development only).
   */
  histories?: boolean;
  /** Where the demo photographs go (the running server's object store); without it, no condition histories are seeded. */
  store?: ObjectStore;
  log?: (m: string) => void;
  /**
   * Stops the seed at the next record (start's Ctrl-C): the returned promise then rejects with the
   * signal's reason once nothing of the seed is running any more. The next seed carries on.
   */
  signal?: AbortSignal;
}

/**
 * Which parts of the demo a seed began and which it finished, kept in the settings table. A part
 * begun and not finished (a stop during the seed) is carried on by the next seed, which skips what
 * is there and writes the rest, so an interrupted first start never leaves the demo half made.
 */
type Part = 'catalogue' | 'condition' | 'measurements' | 'loans' | 'climate' | 'schedule';
type Progress = Partial<Record<Part, 'started' | 'done'>>;
const PROGRESS_KEY = 'demo_seed';

async function progress(): Promise<Progress> {
  return ((await Setting.findByPk(PROGRESS_KEY))?.value as Progress | undefined) ?? {};
}

async function mark(part: Part, state: 'started' | 'done'): Promise<void> {
  await Setting.upsert({ key: PROGRESS_KEY, value: { ...(await progress()), [part]: state } });
}

/**
 * Seeds the invented demo users when the database holds none yet, then (in development) the demo
 * catalogue when it holds no catalogue records, then condition and measurement histories for
 * part of it when those are empty. Returns whether anything was seeded.
 */
export async function seedDemoIfEmpty(sequelize: Sequelize, options: SeedDemoOptions = {}): Promise<boolean> {
  const signal = options.signal;
  signal?.throwIfAborted();
  const seededUsers = await sequelize.transaction(async (t) => {
    // One seeder at a time, even if two starts race.
    await sequelize.query('SELECT pg_advisory_xact_lock(727001)', { transaction: t });
    if ((await User.count({ transaction: t })) > 0) return false;
    for (const a of DEMO_ACCOUNTS) {
      // Provisioned by e-mail: the first sign-in through the identity provider claims the row.
      const user = await User.create({ issuer: null, subject: null, email: a.email, name: a.name, role: a.role, lastSignInAt: null }, { transaction: t });
      await recordAudit({ actor: null, action: 'user.provisioned', entityType: 'user', entityId: user.id, after: { email: a.email, role: a.role }, requestId: 'seed' }, t);
    }
    return true;
  });
  const catalogue = options.catalogue ?? env().NODE_ENV === 'development';
  if (!catalogue) return seededUsers;
  const log = options.log ?? ((m: string) => console.log(`[toneledger] ${m}`));
  const seededCatalogue = await seedCatalogueIfEmpty(sequelize, log, signal);
  if (!(options.histories ?? catalogue)) return seededUsers || seededCatalogue;
  const seededHistories = await seedHistoriesIfEmpty(sequelize, options.store ?? null, log, signal);
  const seededLoans = await seedLoansIfEmpty(sequelize, log, signal);
  const seededClimate = await seedClimateIfEmpty(sequelize, log, signal);
  const seededSchedules = await seedSchedulesIfNew(sequelize, log, signal);
  const seededProcedures = await seedDemoProceduresIfEmpty(sequelize, log);
  return seededUsers || seededCatalogue || seededHistories || seededLoans || seededClimate || seededSchedules || seededProcedures;
}

/**
 * The catalogue seed runs through the services, which open their own transactions; this
 * transaction only holds the advisory lock (so two starts never seed twice) while they run.
 */
async function seedCatalogueIfEmpty(sequelize: Sequelize, log: (m: string) => void, signal?: AbortSignal): Promise<boolean> {
  signal?.throwIfAborted();
  const lock = await sequelize.transaction();
  try {
    await sequelize.query('SELECT pg_advisory_xact_lock(727002)', { transaction: lock });
    const [{ n }] = await sequelize.query<{ n: number }>(
      `SELECT (SELECT count(*) FROM prints) + (SELECT count(*) FROM makers) + (SELECT count(*) FROM papers)
            + (SELECT count(*) FROM bath_recipes) + (SELECT count(*) FROM locations) + (SELECT count(*) FROM enclosure_types) AS n`,
      { type: QueryTypes.SELECT, transaction: lock },
    );
    const resuming = (await progress()).catalogue === 'started';
    if (Number(n) > 0 && !resuming) return false;
    // The registrar of the demo catalogues it, so the audit trail and history name a person.
    const registrar = DEMO_ACCOUNTS.find((a) => a.role === 'registrar')!;
    const user = await User.findOne({ where: { email: registrar.email }, transaction: lock });
    log(resuming ? 'Carrying on with the demo catalogue an earlier start began…' : 'Seeding the demo catalogue (about 300 prints; takes a few seconds)…');
    await mark('catalogue', 'started');
    await seedDemoCatalogue({ id: user?.id ?? null, name: user?.name ?? registrar.name }, log, { signal });
    await mark('catalogue', 'done');
    return true;
  } finally {
    await lock.commit();
  }
}

/**
 * Condition reports with photographs, then measurements, each only when its tables are empty
 * (and there is a catalogue to describe). Like the catalogue, they run through the services,
 * signed in as the demo conservator, under an advisory lock held by a transaction of their own.
 */
async function seedHistoriesIfEmpty(sequelize: Sequelize, store: ObjectStore | null, log: (m: string) => void, signal?: AbortSignal): Promise<boolean> {
  signal?.throwIfAborted();
  const lock = await sequelize.transaction();
  try {
    await sequelize.query('SELECT pg_advisory_xact_lock(727003)', { transaction: lock });
    const [counts] = await sequelize.query<{ prints: number; condition: number; measurements: number }>(
      `SELECT (SELECT count(*) FROM prints)::int AS prints,
              ((SELECT count(*) FROM condition_reports) + (SELECT count(*) FROM images))::int AS condition,
              ((SELECT count(*) FROM measurement_spots) + (SELECT count(*) FROM measurement_sessions))::int AS measurements`,
      { type: QueryTypes.SELECT, transaction: lock },
    );
    const begun = await progress();
    const condition = counts.condition === 0 || begun.condition === 'started';
    const measurements = counts.measurements === 0 || begun.measurements === 'started';
    if (counts.prints === 0 || (!condition && !measurements)) return false;
    const conservator = DEMO_ACCOUNTS.find((a) => a.role === 'conservator')!;
    const user = await User.findOne({ where: { email: conservator.email }, transaction: lock });
    if (!user) {
      log('No demo conservator account: the demo condition and measurement histories were not seeded.');
      return false;
    }
    const actor = { id: user.id, name: user.name ?? conservator.name };
    let seeded = false;
    if (condition) {
      if (store) {
        log(begun.condition === 'started'
          ? 'Carrying on with the demo condition histories an earlier start began…'
          : 'Seeding demo condition histories with photographs (about 40 prints; takes under a minute)…');
        await mark('condition', 'started');
        await seedDemoCondition(store, actor, log, { signal });
        await mark('condition', 'done');
        seeded = true;
      } else {
        log('No object store given: the demo condition histories and photographs were not seeded.');
      }
    }
    if (measurements) {
      log(begun.measurements === 'started' ? 'Carrying on with the demo measurement histories an earlier start began…' : 'Seeding demo measurement histories (about 190 prints)…');
      await mark('measurements', 'started');
      await seedDemoMeasurements(actor, log, { signal });
      await mark('measurements', 'done');
      seeded = true;
    }
    return seeded;
  } finally {
    await lock.commit();
  }
}

/**
 * Exhibitions, display periods and loans (demo-loans.ts), after the measurements (the light-cost
 * fit places displays between measurement sessions): only when there are none yet, or when an
 * earlier seed began them. Loans and displays are the registrar's, reports and approvals the
 * conservator's, under an advisory lock of their own.
 */
async function seedLoansIfEmpty(sequelize: Sequelize, log: (m: string) => void, signal?: AbortSignal): Promise<boolean> {
  signal?.throwIfAborted();
  const lock = await sequelize.transaction();
  try {
    await sequelize.query('SELECT pg_advisory_xact_lock(727004)', { transaction: lock });
    const [counts] = await sequelize.query<{ prints: number; loans: number }>(
      `SELECT (SELECT count(*) FROM prints)::int AS prints,
              ((SELECT count(*) FROM exhibitions) + (SELECT count(*) FROM loans))::int AS loans`,
      { type: QueryTypes.SELECT, transaction: lock },
    );
    const begun = await progress();
    if (counts.prints === 0 || (counts.loans > 0 && begun.loans !== 'started')) return false;
    const people = await Promise.all((['registrar', 'conservator'] as const).map(async (role) => {
      const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
      const user = await User.findOne({ where: { email: account.email }, transaction: lock });
      return user ? { id: user.id, name: user.name ?? account.name, role } : null;
    }));
    const [registrar, conservator] = people;
    if (!registrar || !conservator) {
      log('No demo registrar or conservator account: the demo exhibitions and loans were not seeded.');
      return false;
    }
    log(begun.loans === 'started' ? 'Carrying on with the demo exhibitions and loans an earlier start began…' : 'Seeding demo exhibitions, display periods and loans…');
    await mark('loans', 'started');
    await seedDemoLoans(registrar, conservator, log, { signal });
    await mark('loans', 'done');
    return true;
  } finally {
    await lock.commit();
  }
}

/** Invented logger readings for the print stores (demo-climate.ts), before the schedule that reads them: when no reading is held, or the part was begun and stopped. */
async function seedClimateIfEmpty(sequelize: Sequelize, log: (m: string) => void, signal?: AbortSignal): Promise<boolean> {
  signal?.throwIfAborted();
  const lock = await sequelize.transaction();
  try {
    await sequelize.query('SELECT pg_advisory_xact_lock(727006)', { transaction: lock });
    const [{ prints, readings }] = await sequelize.query<{ prints: number; readings: number }>(
      'SELECT (SELECT count(*) FROM prints)::int AS prints, (SELECT count(*) FROM (SELECT 1 FROM climate_readings LIMIT 1) x)::int AS readings',
      { type: QueryTypes.SELECT, transaction: lock },
    );
    const begun = await progress();
    if (prints === 0 || (readings > 0 && begun.climate !== 'started')) return false;
    const account = DEMO_ACCOUNTS.find((a) => a.role === 'conservator')!;
    const user = await User.findOne({ where: { email: account.email }, transaction: lock });
    if (!user) return false;
    log(begun.climate === 'started' ? 'Carrying on with the demo logger readings an earlier start began…' : 'Writing demo logger readings for the print stores…');
    await mark('climate', 'started');
    await seedDemoClimate({ id: user.id, name: user.name, role: 'conservator' }, log, { signal });
    await mark('climate', 'done');
    return true;
  } finally {
    await lock.commit();
  }
}

/**
 * Every demo print's next-inspection date (demo-schedule.ts), last, since the other parts are its
 * inputs: when the demo has prints and this part was never finished (begun and stopped: carried on).
 */
async function seedSchedulesIfNew(sequelize: Sequelize, log: (m: string) => void, signal?: AbortSignal): Promise<boolean> {
  signal?.throwIfAborted();
  const lock = await sequelize.transaction();
  try {
    await sequelize.query('SELECT pg_advisory_xact_lock(727005)', { transaction: lock });
    const [{ prints }] = await sequelize.query<{ prints: number }>('SELECT count(*)::int AS prints FROM prints', { type: QueryTypes.SELECT, transaction: lock });
    const begun = await progress();
    if (prints === 0 || begun.schedule === 'done') return false;
    log(begun.schedule === 'started' ? 'Carrying on with the demo next-inspection dates an earlier start began…' : 'Computing every demo print\'s next-inspection date…');
    await mark('schedule', 'started');
    await seedDemoSchedules(log, { signal });
    await mark('schedule', 'done');
    return true;
  } finally {
    await lock.commit();
  }
}
