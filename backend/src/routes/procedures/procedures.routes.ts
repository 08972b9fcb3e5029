import { acquisitionsApi, deaccessionsApi, entriesApi, treatmentsApi, voidsApi } from '@toneledger/common/api/procedures';
import { implement, type RouteDef } from '../../http/route';
import {
  acquisitionOfPrint, createAcquisition, createEntry, getAcquisition, getEntry, listAcquisitions, listEntries, setAcquisitionPrints, updateAcquisition, updateEntry,
} from '../../services/acquisition.service';
import { approveDeaccession, completeDeaccession, printDeaccessions, proposeDeaccession, updateDeaccession, withdrawDeaccession } from '../../services/deaccession.service';
import {
  addTreatmentAddendum, approveTreatment, completeTreatment, getTreatment, listTreatments, printTreatments, proposeTreatment, signTreatment, updateTreatment,
} from '../../services/treatment.service';
import { voidCaptureDate, voidSession } from '../../services/void.service';

/** Treatments, object entries and acquisitions, deaccessions, and voiding a session or a capture date. */
export function proceduresRoutes(): RouteDef[] {
  return [
    ...implement(treatmentsApi, {
      list: async ({ query }) => ({ data: await listTreatments(query.status) }),
      forPrint: async ({ params }) => ({ data: await printTreatments(params.id) }),
      propose: async ({ params, body, actor, requestId }) => ({ data: await proposeTreatment(params.id, body, actor, requestId) }),
      get: async ({ params }) => ({ data: await getTreatment(params.id) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateTreatment(params.id, body, actor, requestId) }),
      approve: async ({ params, body, actor, requestId }) => ({ data: await approveTreatment(params.id, body, actor, requestId) }),
      complete: async ({ params, body, actor, requestId }) => ({ data: await completeTreatment(params.id, body.version, actor, requestId) }),
      sign: async ({ params, body, actor, requestId }) => ({ data: await signTreatment(params.id, body.version, actor, requestId) }),
      addAddendum: async ({ params, body, actor, requestId }) => ({ data: await addTreatmentAddendum(params.id, body.text, actor, requestId) }),
    }),
    ...implement(entriesApi, {
      list: async ({ query }) => ({ data: await listEntries(query.q) }),
      create: async ({ body, actor, requestId }) => ({ data: await createEntry(body, actor, requestId) }),
      get: async ({ params }) => ({ data: await getEntry(params.id) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateEntry(params.id, body, actor, requestId) }),
    }),
    ...implement(acquisitionsApi, {
      list: async () => ({ data: await listAcquisitions() }),
      create: async ({ body, actor, requestId }) => ({ data: await createAcquisition(body, actor, requestId) }),
      get: async ({ params }) => ({ data: await getAcquisition(params.id) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateAcquisition(params.id, body, actor, requestId) }),
      setPrints: async ({ params, body, actor, requestId }) => ({ data: await setAcquisitionPrints(params.id, body, actor, requestId) }),
      forPrint: async ({ params }) => ({ data: await acquisitionOfPrint(params.id) }),
    }),
    ...implement(deaccessionsApi, {
      forPrint: async ({ params }) => ({ data: await printDeaccessions(params.id) }),
      propose: async ({ params, body, actor, requestId }) => ({ data: await proposeDeaccession(params.id, body, actor, requestId) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateDeaccession(params.id, body, actor, requestId) }),
      approve: async ({ params, body, actor, requestId }) => ({ data: await approveDeaccession(params.id, body, actor, requestId) }),
      complete: async ({ params, body, actor, requestId }) => ({ data: await completeDeaccession(params.id, body, actor, requestId) }),
      withdraw: async ({ params, body, actor, requestId }) => ({ data: await withdrawDeaccession(params.id, body, actor, requestId) }),
    }),
    ...implement(voidsApi, {
      session: async ({ params, body, actor, requestId }) => ({ data: await voidSession(params.id, body.reason, actor, requestId) }),
      captureDate: async ({ params, body, actor, requestId }) => ({ data: await voidCaptureDate(params.id, body, actor, requestId) }),
    }),
  ];
}
