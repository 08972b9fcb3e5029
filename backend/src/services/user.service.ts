import { Op, type Transaction } from 'sequelize';
import type { Role } from '@toneledger/common/domain/roles';
import type { Me, User as UserDto, UserListQuery } from '@toneledger/common/schemas/users';
import { db } from '../db';
import { User } from '../models';
import { conflict, notFound } from '../errors';
import type { SignedInUser } from '../auth/current-user';
import { recordAudit, type AuditActor } from './audit.service';
import { presentMe, presentUser } from '../presenters/user.presenter';

export interface SignInClaims {
  issuer: string;
  subject: string;
  email: string | null;
  name: string | null;
}

export interface SignInPolicy {
  adminEmails: string[];
  defaultRole: Role;
}

/**
 * Finds or creates the user for an identity. A user provisioned ahead by e-mail (an invitation,
 * or the demo seed) is claimed by the first sign-in with that address.
 */
export async function upsertOnSignIn(claims: SignInClaims, policy: SignInPolicy, requestId: string | null): Promise<User> {
  return db().transaction(async (t) => {
    let user = await User.findOne({ where: { issuer: claims.issuer, subject: claims.subject }, transaction: t, lock: t.LOCK.UPDATE });
    const email = claims.email?.trim() || null;
    if (!user && email) {
      user = await User.findOne({
        where: { subject: null, email: { [Op.iLike]: email } },
        transaction: t,
        lock: t.LOCK.UPDATE,
      });
      if (user) {
        await user.update({ issuer: claims.issuer, subject: claims.subject }, { transaction: t });
      }
    }
    const now = new Date();
    if (user?.deactivatedAt) {
      // Kept in the record, never signed in again: the caller sees `deactivatedAt` and refuses the session.
      await recordAudit(
        { actor: { id: user.id, name: user.name }, action: 'session.refused_deactivated', entityType: 'user', entityId: user.id, requestId },
        t,
      );
      return user;
    }
    if (!user) {
      const admin = email !== null && policy.adminEmails.some((a) => a.toLowerCase() === email.toLowerCase());
      user = await User.create(
        {
          issuer: claims.issuer,
          subject: claims.subject,
          email,
          name: claims.name?.trim() || email || claims.subject,
          role: admin ? 'admin' : policy.defaultRole,
          lastSignInAt: now,
        },
        { transaction: t },
      );
      await recordAudit(
        { actor: { id: user.id, name: user.name }, action: 'user.created', entityType: 'user', entityId: user.id, after: presentUser(user), requestId },
        t,
      );
    } else {
      await user.update(
        { lastSignInAt: now, ...(claims.name ? { name: claims.name } : {}), ...(email ? { email } : {}) },
        { transaction: t },
      );
    }
    await recordAudit(
      { actor: { id: user.id, name: user.name }, action: 'session.signed_in', entityType: 'user', entityId: user.id, requestId },
      t,
    );
    return user;
  });
}

export async function findUser(id: string): Promise<User | null> {
  return User.findByPk(id);
}

/**
 * The signed-in user as they see themselves: role, permissions, when the session ends. `user` is
 * the row read on this request with the session (auth/session.ts), so there is no second read.
 */
export function getMe(user: SignedInUser, sessionExpiresAt: Date, environment: Me['environment']): Me {
  return presentMe(user, sessionExpiresAt, environment);
}

const SORTS: Record<string, [string, 'ASC' | 'DESC']> = {
  name: ['name', 'ASC'],
  '-name': ['name', 'DESC'],
  email: ['email', 'ASC'],
  '-email': ['email', 'DESC'],
  role: ['role', 'ASC'],
  '-role': ['role', 'DESC'],
  lastSignInAt: ['lastSignInAt', 'ASC'],
  '-lastSignInAt': ['lastSignInAt', 'DESC'],
};

export async function listUsers(query: UserListQuery) {
  const where: Record<string | symbol, unknown> = {};
  if (query.role) where.role = query.role;
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where[Op.or] = [{ name: { [Op.iLike]: like } }, { email: { [Op.iLike]: like } }];
  }
  const [field, dir] = SORTS[query.sort] ?? SORTS.name;
  const { rows, count } = await User.findAndCountAll({
    where,
    order: [[field, dir === 'ASC' ? 'ASC NULLS LAST' : 'DESC NULLS LAST'], ['id', 'ASC']],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  const admins = await activeAdmins();
  return { rows: rows.map((u) => presentUser(u, isLastAdmin(u, admins))), total: count };
}

/** Role changes take this transaction-scoped lock, so they run one at a time. */
const ROLE_CHANGE_LOCK = 727002;

/**
 * Changes a user's role. The last admin cannot lose the role: role changes are serialised by an
 * advisory lock, so two concurrent demotions cannot both pass the check (and cannot deadlock).
 */
export async function changeRole(
  id: string,
  role: Role,
  reason: string | undefined,
  actor: AuditActor,
  requestId: string | null,
): Promise<UserDto> {
  return db().transaction(async (t: Transaction) => {
    await db().query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: ROLE_CHANGE_LOCK }, transaction: t });
    const user = await User.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
    if (!user) throw notFound('The user');
    if (user.role === role) return presentUser(user);
    if (user.role === 'admin' && !user.deactivatedAt && (await activeAdmins(t)) <= 1) {
      throw conflict(LAST_ADMIN);
    }
    const before = presentUser(user);
    await user.update({ role }, { transaction: t });
    await recordAudit(
      { actor, action: 'user.role_changed', entityType: 'user', entityId: user.id, before: { role: before.role }, after: { role, ...(reason ? { reason } : {}) }, requestId },
      t,
    );
    return presentUser(user, isLastAdmin(user, await activeAdmins(t)));
  });
}

const LAST_ADMIN = 'This is the last administrator: make someone else an administrator first.';

/** Administrators who can still sign in. */
function activeAdmins(transaction?: Transaction): Promise<number> {
  return User.count({ where: { role: 'admin', deactivatedAt: null }, transaction });
}

function isLastAdmin(user: Pick<User, 'role' | 'deactivatedAt'>, admins: number): boolean {
  return user.role === 'admin' && !user.deactivatedAt && admins <= 1;
}

/**
 * Deactivates a person: kept in the record, refused at sign-in, and every session of theirs ends
 * now (the rows go, and the session read ignores a deactivated user besides). Nobody deactivates
 * themselves, and the last active administrator stays. Serialised with role changes.
 */
export async function deactivateUser(id: string, reason: string | undefined, actor: AuditActor & { id: string }, requestId: string | null): Promise<UserDto> {
  return db().transaction(async (t: Transaction) => {
    await db().query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: ROLE_CHANGE_LOCK }, transaction: t });
    const user = await User.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
    if (!user) throw notFound('The user');
    if (user.deactivatedAt) return presentUser(user, false);
    if (user.id === actor.id) throw conflict('You cannot deactivate yourself: ask another administrator.');
    if (user.role === 'admin' && (await activeAdmins(t)) <= 1) throw conflict(LAST_ADMIN);
    const at = new Date();
    await user.update({ deactivatedAt: at, deactivationReason: reason ?? null }, { transaction: t });
    const [, ended] = (await db().query(`DELETE FROM http_sessions WHERE sess->>'userId' = :id`, { replacements: { id: user.id }, transaction: t })) as [unknown, { rowCount?: number } | number];
    await recordAudit(
      {
        actor, action: 'user.deactivated', entityType: 'user', entityId: user.id, before: { active: true },
        after: { active: false, ...(reason ? { reason } : {}), sessionsEnded: typeof ended === 'number' ? ended : (ended?.rowCount ?? 0) }, requestId,
      },
      t,
    );
    return presentUser(user, false);
  });
}

/** Lets a deactivated person sign in again, with the role they had. */
export async function reactivateUser(id: string, actor: AuditActor, requestId: string | null): Promise<UserDto> {
  return db().transaction(async (t: Transaction) => {
    await db().query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: ROLE_CHANGE_LOCK }, transaction: t });
    const user = await User.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
    if (!user) throw notFound('The user');
    if (user.deactivatedAt) {
      await user.update({ deactivatedAt: null, deactivationReason: null }, { transaction: t });
      await recordAudit({ actor, action: 'user.reactivated', entityType: 'user', entityId: user.id, before: { active: false }, after: { active: true }, requestId }, t);
    }
    return presentUser(user, isLastAdmin(user, await activeAdmins(t)));
  });
}
