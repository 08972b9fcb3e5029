import type { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import type { Permission } from '../domain/roles';
import { endpoint } from './endpoint';

/** A section of the settings (`/api/settings/<name>`): read by those who use it, changed by administrators. */
export function settingsSection<const Name extends string, S extends z.ZodType, Read extends Permission>(s: {
  name: Name; title: string; read: Read; schema: S; readSummary: string; changeSummary: string; tags: readonly string[];
}) {
  const path = `/api/settings/${s.name}` as const;
  const response = { description: s.title, schema: dataEnvelope(s.schema) };
  return {
    get: endpoint({ method: 'get', path, summary: s.readSummary, tags: s.tags, access: s.read, response }),
    put: endpoint({ method: 'put', path, summary: s.changeSummary, tags: s.tags, access: 'settings.manage', body: s.schema, response }),
  };
}
