import { z } from 'zod';
import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import {
  calendarFeedSchema, digestListQuerySchema, digestSendSchema, printScheduleSchema, remindersInputSchema, remindersSchema, roundDetailSchema,
  roundInputSchema, roundListQuerySchema, roundSchema, roundUpdateSchema, scheduleOverrideInputSchema, scheduleRecomputeSchema,
  worklistCountsSchema, worklistItemSchema, worklistQuerySchema,
} from '../schemas/inspections';
import { idParamsSchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

export const scheduleApi = {
  print: endpoint({
    method: 'get', path: '/api/prints/:id/inspection', summary: "A print's next-inspection date, its risk and the factors behind it, largest first",
    tags: ['inspections'], access: 'schedule.read', params: idParamsSchema,
    response: { description: 'Schedule', schema: dataEnvelope(printScheduleSchema) },
  }),
  override: endpoint({
    method: 'put', path: '/api/prints/:id/inspection-override',
    summary: "Sets a conservator's own next-inspection date with a reason, or (dueOn null) returns the print to its computed date; audited",
    tags: ['inspections'], access: 'schedule.write', params: idParamsSchema, body: scheduleOverrideInputSchema,
    response: { description: 'Schedule', schema: dataEnvelope(printScheduleSchema) },
  }),
  worklist: endpoint({
    method: 'get', path: '/api/inspections', summary: 'The work list: prints by next-inspection date, filtered by window, place, risk, reason and assignee',
    tags: ['inspections'], access: 'schedule.read', query: worklistQuerySchema,
    response: { description: 'Prints due', schema: pageEnvelope(worklistItemSchema).extend({ counts: worklistCountsSchema }) },
  }),
  recomputeStatus: endpoint({
    method: 'get', path: '/api/inspections/recompute', summary: 'Progress of the last full recompute of every print\'s date (null: never run)',
    tags: ['inspections'], access: 'schedule.read', response: { description: 'Progress', schema: dataEnvelope(scheduleRecomputeSchema.nullable()) },
  }),
  recompute: endpoint({
    method: 'post', path: '/api/inspections/recompute', summary: "Starts a full recompute of every print's date as a background job (one at a time; 409 while one runs)",
    tags: ['inspections'], access: 'schedule.write', status: 202,
    response: { description: 'Progress', schema: dataEnvelope(scheduleRecomputeSchema) },
  }),
};

export const roundsApi = {
  list: endpoint({
    method: 'get', path: '/api/inspection-rounds', summary: 'Inspection rounds, soonest planned first',
    tags: ['inspections'], access: 'schedule.read', query: roundListQuerySchema, response: { description: 'Rounds', schema: pageEnvelope(roundSchema) },
  }),
  create: endpoint({
    method: 'post', path: '/api/inspection-rounds', summary: 'Plans a dated round of checks assigned to a conservator', tags: ['inspections'],
    access: 'schedule.write', body: roundInputSchema, status: 201, idempotent: true,
    response: { description: 'The round', schema: dataEnvelope(roundDetailSchema) },
  }),
  get: endpoint({
    method: 'get', path: '/api/inspection-rounds/:id', summary: 'One round with its prints in shelf order, each with its last grade and what to look at',
    tags: ['inspections'], access: 'schedule.read', params: idParamsSchema, response: { description: 'The round', schema: dataEnvelope(roundDetailSchema) },
  }),
  update: endpoint({
    method: 'patch', path: '/api/inspection-rounds/:id', summary: 'Changes a round: title, date, assignee, notes, status, prints added or taken out',
    tags: ['inspections'], access: 'schedule.write', params: idParamsSchema, body: roundUpdateSchema,
    response: { description: 'The round', schema: dataEnvelope(roundDetailSchema) },
  }),
  assignees: endpoint({
    method: 'get', path: '/api/inspection-assignees', summary: 'People a round can be assigned to (conservators)',
    tags: ['inspections'], access: 'schedule.read',
    response: { description: 'People', schema: dataEnvelope(z.array(z.object({ id: z.string().uuid(), name: z.string() }))) },
  }),
};

export const remindersApi = {
  get: endpoint({
    method: 'get', path: '/api/me/reminders', summary: 'My reminders: the weekly digest (on or off, its day) and whether I have a calendar feed',
    tags: ['inspections'], access: 'schedule.read', response: { description: 'Reminders', schema: dataEnvelope(remindersSchema) },
  }),
  put: endpoint({
    method: 'put', path: '/api/me/reminders', summary: 'Switches my weekly digest on or off and chooses its day', tags: ['inspections'],
    access: 'schedule.read', body: remindersInputSchema, response: { description: 'Reminders', schema: dataEnvelope(remindersSchema) },
  }),
  rotateFeed: endpoint({
    method: 'post', path: '/api/me/calendar-feed', summary: 'Makes a new secret calendar feed address (shown once); any earlier address stops working',
    tags: ['inspections'], access: 'schedule.read', status: 201, response: { description: 'The feed address', schema: dataEnvelope(calendarFeedSchema) },
  }),
  revokeFeed: endpoint({
    method: 'delete', path: '/api/me/calendar-feed', summary: 'Ends my calendar feed: its address stops working', tags: ['inspections'],
    access: 'schedule.read', status: 204, response: { description: 'Ended' },
  }),
  feed: endpoint({
    method: 'get', path: '/api/calendar/:token', summary: "A person's calendar (iCalendar, RFC 5545): an all-day VEVENT per planned round of theirs, its prints listed in the description; the secret address is the only key",
    tags: ['inspections'], access: 'public', params: z.object({ token: z.string().min(20).max(200).regex(/^[A-Za-z0-9_-]+(\.ics)?$/, 'Not a feed address') }),
    response: { description: 'iCalendar', contentType: 'text/calendar' },
  }),
  digests: endpoint({
    method: 'get', path: '/api/digests', summary: 'Every weekly digest sent or tried, newest first, with failures and their error',
    tags: ['inspections'], access: 'digests.read', query: digestListQuerySchema, response: { description: 'Digests', schema: pageEnvelope(digestSendSchema) },
  }),
};
