import { QueryTypes, type Sequelize } from 'sequelize';
import { env } from '../config/env';
import { User } from '../models';
import { recordAudit } from '../services/audit.service';
import { DEMO_ACCOUNTS } from './demo-accounts';
import { seedDemoCatalogue } from './demo-catalogue';

export interface SeedDemoOptions {
  /**
   * Also build the demo catalogue (a few hundred prints) when the catalogue is empty. By default
   * only in development: the shared test database keeps an empty catalogue for the API tests.
   */
  catalogue?: boolean;
  log?: (m: string) => void;
}

/**
 * Seeds the invented demo users when the database holds none yet, then (in development) the demo
 * catalogue when it holds no catalogue records. Returns whether anything was seeded.
 */
export async function seedDemoIfEmpty(sequelize: Sequelize, options: SeedDemoOptions = {}): Promise<boolean> {
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
  if (!(options.catalogue ?? env().NODE_ENV === 'development')) return seededUsers;
  const seededCatalogue = await seedCatalogueIfEmpty(sequelize, options.log ?? ((m) => console.log(`[toneledger] ${m}`)));
  return seededUsers || seededCatalogue;
}

/**
 * The catalogue seed runs through the services, which open their own transactions; this
 * transaction only holds the advisory lock (so two starts never seed twice) while they run.
 */
async function seedCatalogueIfEmpty(sequelize: Sequelize, log: (m: string) => void): Promise<boolean> {
  const lock = await sequelize.transaction();
  try {
    await sequelize.query('SELECT pg_advisory_xact_lock(727002)', { transaction: lock });
    const [{ n }] = await sequelize.query<{ n: number }>(
      `SELECT (SELECT count(*) FROM prints) + (SELECT count(*) FROM makers) + (SELECT count(*) FROM papers)
            + (SELECT count(*) FROM bath_recipes) + (SELECT count(*) FROM locations) + (SELECT count(*) FROM enclosure_types) AS n`,
      { type: QueryTypes.SELECT, transaction: lock },
    );
    if (Number(n) > 0) return false;
    // The registrar of the demo catalogues it, so the audit trail and history name a person.
    const registrar = DEMO_ACCOUNTS.find((a) => a.role === 'registrar')!;
    const user = await User.findOne({ where: { email: registrar.email }, transaction: lock });
    log('Seeding the demo catalogue (about 300 prints; takes a few seconds)…');
    await seedDemoCatalogue({ id: user?.id ?? null, name: user?.name ?? registrar.name }, log);
    return true;
  } finally {
    await lock.commit();
  }
}
