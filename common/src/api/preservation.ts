import { dataEnvelope } from '../schemas/envelope';
import { idParamsSchema } from '../schemas/primitives';
import { bagExportStartSchema, bagJobSchema } from '../schemas/preservation';
import { z } from 'zod';
import { endpoint } from './endpoint';

export const preservationApi = {
  startExport: endpoint({
    method: 'post', path: '/api/preservation/exports',
    summary: 'Starts writing a BagIt bag (RFC 8493) of the whole collection (administrators) or of a selection (a catalogue search or a list of prints) as a background job; audited',
    tags: ['preservation'], access: 'selection.export', body: bagExportStartSchema, status: 202, idempotent: true,
    response: { description: 'The export, queued', schema: dataEnvelope(bagJobSchema) },
  }),
  list: endpoint({
    method: 'get', path: '/api/preservation/jobs', summary: 'The latest exports and imports of bags (a registrar sees their own exports)', tags: ['preservation'],
    access: 'selection.export', response: { description: 'Newest first, at most 50', schema: dataEnvelope(z.array(bagJobSchema)) },
  }),
  get: endpoint({
    method: 'get', path: '/api/preservation/jobs/:id', summary: 'An export or import of a bag: progress, outcome, problems found', tags: ['preservation'],
    access: 'selection.export', params: idParamsSchema, response: { description: 'The job', schema: dataEnvelope(bagJobSchema) },
  }),
  download: endpoint({
    method: 'get', path: '/api/preservation/jobs/:id/bag.tar', summary: 'The finished bag as a tar file (streamed from object storage); audited', tags: ['preservation'],
    access: 'selection.export', params: idParamsSchema,
    response: { description: 'A POSIX tar holding one folder, the bag', contentType: 'application/x-tar' },
  }),
  startImport: endpoint({
    method: 'post', path: '/api/preservation/imports',
    summary: 'Uploads a bag (field `bag`, a tar file) and brings it into this installation, which must hold no prints: the bag is checked first (every manifest checksum, Payload-Oxum, the tag files), then every record, image and audit event is written in one run, keeping ids; audited',
    tags: ['preservation'], access: 'collection.import', requestContentType: 'multipart/form-data', status: 202,
    response: { description: 'The import, queued', schema: dataEnvelope(bagJobSchema) },
  }),
};
