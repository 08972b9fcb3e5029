import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import { deactivationSchema, meSchema, roleChangeSchema, userIdParamsSchema, userListQuerySchema, userSchema } from '../schemas/users';
import { auditChoicesSchema, auditEventSchema, auditExportQuerySchema, auditListQuerySchema } from '../schemas/audit';
import { endpoint } from './endpoint';

export const meApi = {
  get: endpoint({
    method: 'get', path: '/api/me', summary: 'The signed-in user, their role and permissions', tags: ['session'],
    access: 'signed_in', response: { description: 'The signed-in user', schema: dataEnvelope(meSchema) },
  }),
};

export const usersApi = {
  list: endpoint({
    method: 'get', path: '/api/users', summary: 'Everyone who has signed in or been provisioned, with their role', tags: ['users'],
    access: 'users.manage', query: userListQuerySchema, response: { description: 'A page of users', schema: pageEnvelope(userSchema) },
  }),
  changeRole: endpoint({
    method: 'patch', path: '/api/users/:id/role', summary: "Changes a user's role (409 if it would leave no administrator)", tags: ['users'],
    access: 'users.manage', params: userIdParamsSchema, body: roleChangeSchema,
    response: { description: 'The changed user', schema: dataEnvelope(userSchema) },
  }),
  deactivate: endpoint({
    method: 'post', path: '/api/users/:id/deactivate',
    summary: 'Deactivates a person: kept in the record, cannot sign in, their sessions end (409 for oneself or the last administrator)', tags: ['users'],
    access: 'users.manage', params: userIdParamsSchema, body: deactivationSchema,
    response: { description: 'The deactivated user', schema: dataEnvelope(userSchema) },
  }),
  reactivate: endpoint({
    method: 'post', path: '/api/users/:id/reactivate', summary: 'Lets a deactivated person sign in again, with the role they had', tags: ['users'],
    access: 'users.manage', params: userIdParamsSchema,
    response: { description: 'The reactivated user', schema: dataEnvelope(userSchema) },
  }),
};

export const auditApi = {
  list: endpoint({
    method: 'get', path: '/api/audit', summary: 'The audit trail, newest first: who, when, what, before and after', tags: ['audit'],
    access: 'audit.read', query: auditListQuerySchema, response: { description: 'A page of audit events', schema: pageEnvelope(auditEventSchema) },
  }),
  choices: endpoint({
    method: 'get', path: '/api/audit/choices', summary: "What the audit screen's pickers offer: the people in the trail and the actions recorded", tags: ['audit'],
    access: 'audit.read', response: { description: 'People and actions', schema: dataEnvelope(auditChoicesSchema) },
  }),
  exportCsv: endpoint({
    method: 'get', path: '/api/audit/export.csv', summary: 'The filtered audit trail as CSV (UTF-8 with BOM), newest first, each action as a sentence', tags: ['audit'],
    access: 'audit.read', query: auditExportQuerySchema, response: { description: 'CSV, UTF-8 with BOM, one row per change of a field (one row for an event without changes)', contentType: 'text/csv' },
  }),
};
