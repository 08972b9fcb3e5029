import { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import { lightRecomputeSchema, lightSettingsSchema, overBudgetItemSchema, printLightSchema, responsivityOverrideInputSchema } from '../schemas/light';
import { idParamsSchema, isoDate } from '../schemas/primitives';
import { endpoint } from './endpoint';
import { settingsSection } from './settings-section';

export const lightSettingsApi = settingsSection({
  name: 'light', title: 'Light settings', read: 'light.read', schema: lightSettingsSchema, tags: ['settings', 'light'],
  readSummary: 'Light budgets per responsivity category (with their source) and the rules giving each print its default category',
  changeSummary: 'Changes the light budgets and the default category rules',
});

export const lightApi = {
  print: endpoint({
    method: 'get', path: '/api/prints/:id/light', summary: "A print's light dose: category, exposure by year and in total, budget, rest owed, warnings, light cost",
    tags: ['light'], access: 'light.read', params: idParamsSchema, query: z.object({ asOf: isoDate.optional() }),
    response: { description: 'Light dose', schema: dataEnvelope(printLightSchema) },
  }),
  override: endpoint({
    method: 'put', path: '/api/prints/:id/light-responsivity', summary: "Overrides a print's default light category with a reason, or returns it to the default (null)",
    tags: ['light'], access: 'light.write', params: idParamsSchema, body: responsivityOverrideInputSchema,
    response: { description: 'Light dose', schema: dataEnvelope(printLightSchema) },
  }),
  overBudget: endpoint({
    method: 'get', path: '/api/light/over-budget', summary: 'Prints whose displays, as planned, would exceed their annual budget or maximum illuminance',
    tags: ['light'], access: 'light.read', response: { description: 'Prints', schema: dataEnvelope(z.array(overBudgetItemSchema)) },
  }),
  recompute: endpoint({
    method: 'get', path: '/api/settings/light/recompute',
    summary: "Progress of the recompute of every print's category and light warning after the light settings last changed (null: never changed)",
    tags: ['settings', 'light'], access: 'light.read', response: { description: 'Progress', schema: dataEnvelope(lightRecomputeSchema.nullable()) },
  }),
};
