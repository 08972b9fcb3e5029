import type { Contract } from './endpoint';
import { authApi } from './auth';
import { bulkApi, savedSearchesApi } from './bulk';
import { climateApi, climateSettingsApi } from './climate';
import { conditionSettingsApi, conditionTermsApi, reportsApi } from './condition';
import { devMailApi } from './dev-mail';
import { exportsApi } from './exports';
import { displaysApi, exhibitionsApi } from './exhibitions';
import { fixityApi, imagesApi } from './images';
import { iiifApi } from './iiif';
import { importsApi } from './imports';
import { remindersApi, roundsApi, scheduleApi } from './inspections';
import { lightApi, lightSettingsApi } from './light';
import { loansApi } from './loans';
import { measurementSettingsApi, measurementsApi } from './measurements';
import { preservationApi } from './preservation';
import { printsApi } from './prints';
import { acquisitionsApi, deaccessionsApi, entriesApi, treatmentsApi, voidsApi } from './procedures';
import { researchApi } from './research';
import { catalogueSettingsApi, enclosuresApi, locationsApi, makersApi, papersApi, recipesApi } from './reference';
import { systemApi } from './system';
import { auditApi, meApi, usersApi } from './users';

/** Every contract, by resource: the server must implement each endpoint here exactly once (a test checks it). */
export const allContracts: Record<string, Contract> = {
  systemApi, authApi, meApi, usersApi, auditApi, devMailApi, printsApi, importsApi, makersApi, papersApi, recipesApi, enclosuresApi,
  locationsApi, catalogueSettingsApi, imagesApi, fixityApi, iiifApi, conditionSettingsApi, conditionTermsApi, reportsApi, measurementSettingsApi,
  measurementsApi, exhibitionsApi, displaysApi, lightApi, lightSettingsApi, loansApi,
  climateApi, climateSettingsApi, scheduleApi, roundsApi, remindersApi, researchApi,
  exportsApi,
  bulkApi, savedSearchesApi,
  treatmentsApi, entriesApi, acquisitionsApi, deaccessionsApi, voidsApi,
  preservationApi,
};
