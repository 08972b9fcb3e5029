import type { Sequelize } from 'sequelize';
import { User } from '../models';
import { recordAudit } from '../services/audit.service';
import { DEMO_ACCOUNTS } from './demo-accounts';

/** Seeds the invented demo collection when the database holds no users yet. Returns whether it ran. */
export async function seedDemoIfEmpty(sequelize: Sequelize): Promise<boolean> {
  return sequelize.transaction(async (t) => {
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
}
