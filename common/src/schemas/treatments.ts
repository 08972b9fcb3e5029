import { z } from 'zod';
import { inputShape, optionalTextInput } from '../fields/field';
import { TREATMENT_APPROVAL_FIELDS, TREATMENT_PROPOSAL_FIELDS, TREATMENT_RECORD_FIELDS } from '../fields/procedures';
import { addendumSchema } from './condition';
import { id, isoDate } from './primitives';
import { TREATMENT_IMAGE_STAGE, TREATMENT_MATERIAL_KIND, TREATMENT_STATUS } from './procedure-vocab';

/** One dated step of the work done. */
export const treatmentStepSchema = z.object({
  on: isoDate,
  description: z.string().trim().min(1, 'Describe the step').max(4000),
  /** Minutes the step took, if noted. */
  minutes: z.preprocess((v) => (v === '' ? null : v), z.coerce.number({ message: 'Enter minutes' }).int('Whole minutes').min(0).max(100000).nullable()).optional(),
});
/** A material or solvent used, with its batch or product. */
export const treatmentMaterialSchema = z.object({
  kind: z.enum(TREATMENT_MATERIAL_KIND.codes),
  name: z.string().trim().min(1, 'Name the material').max(300),
  batchOrProduct: optionalTextInput(300),
  /** Strength, mixture or how it was applied. */
  notes: optionalTextInput(1000),
});
/** An existing image of the print, tagged before, during or after. */
export const treatmentImageInputSchema = z.object({ imageId: id, stage: z.enum(TREATMENT_IMAGE_STAGE.codes) });

export const treatmentInputSchema = z.object(inputShape(TREATMENT_PROPOSAL_FIELDS));
export type TreatmentInput = z.infer<typeof treatmentInputSchema>;

/** A change: the proposal while proposed, the record of the work until signed. Left-out fields stay. */
export const treatmentUpdateSchema = z.object({
  ...z.object(inputShape(TREATMENT_PROPOSAL_FIELDS)).partial().shape,
  ...z.object(inputShape(TREATMENT_RECORD_FIELDS)).shape,
  steps: z.array(treatmentStepSchema).max(200).optional(),
  materials: z.array(treatmentMaterialSchema).max(200).optional(),
  images: z.array(treatmentImageInputSchema).max(200).optional(),
  version: z.number().int().min(1),
});
export type TreatmentUpdate = z.infer<typeof treatmentUpdateSchema>;

export const treatmentApprovalSchema = z.object({ ...inputShape(TREATMENT_APPROVAL_FIELDS), version: z.number().int().min(1) });
export type TreatmentApproval = z.infer<typeof treatmentApprovalSchema>;

export const treatmentSchema = z.object({
  id, printId: id, accessionNumber: z.string(), printTitle: z.string(),
  status: z.enum(TREATMENT_STATUS.codes),
  proposedOn: isoDate, proposedBy: z.string(), conditionFound: z.string(), aims: z.string(), optionsConsidered: z.string().nullable(), chosenMethod: z.string(),
  approvedByName: z.string().nullable(), approvedOn: isoDate.nullable(), approvalNote: z.string().nullable(),
  startedOn: isoDate.nullable(), completedOn: isoDate.nullable(), hoursSpent: z.number().nullable(), summary: z.string().nullable(),
  steps: z.array(z.object({ on: isoDate, description: z.string(), minutes: z.number().int().nullable() })),
  materials: z.array(z.object({ kind: z.enum(TREATMENT_MATERIAL_KIND.codes), name: z.string(), batchOrProduct: z.string().nullable(), notes: z.string().nullable() })),
  images: z.array(z.object({ imageId: id, stage: z.enum(TREATMENT_IMAGE_STAGE.codes), viewType: z.string(), capturedOn: isoDate.nullable(), thumbUrl: z.string().nullable() })),
  afterReportId: id.nullable(), afterReportExaminedOn: isoDate.nullable(),
  conservatorId: id.nullable(), conservator: z.string(),
  signedAt: z.string().datetime().nullable(), signedBy: z.string().nullable(),
  addenda: z.array(addendumSchema),
  version: z.number().int(), createdAt: z.string().datetime(), updatedAt: z.string().datetime(),
});
export type Treatment = z.infer<typeof treatmentSchema>;

export const treatmentSummarySchema = treatmentSchema.pick({
  id: true, printId: true, accessionNumber: true, printTitle: true, status: true, proposedOn: true, chosenMethod: true, approvedOn: true,
  completedOn: true, conservator: true, signedAt: true,
});
export type TreatmentSummary = z.infer<typeof treatmentSummarySchema>;
