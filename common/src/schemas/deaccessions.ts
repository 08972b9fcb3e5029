import { z } from 'zod';
import { inputShape } from '../fields/field';
import { DEACCESSION_APPROVAL_FIELDS, DEACCESSION_COMPLETION_FIELDS, DEACCESSION_PROPOSAL_FIELDS } from '../fields/procedures';
import { id, isoDate } from './primitives';
import { DEACCESSION_METHOD, DEACCESSION_STATUS } from './procedure-vocab';

export const deaccessionInputSchema = z.object(inputShape(DEACCESSION_PROPOSAL_FIELDS));
export type DeaccessionInput = z.infer<typeof deaccessionInputSchema>;
export const deaccessionUpdateSchema = deaccessionInputSchema.partial().extend({ version: z.number().int().min(1) });
export const deaccessionApprovalSchema = z.object({ ...inputShape(DEACCESSION_APPROVAL_FIELDS), version: z.number().int().min(1) });
export const deaccessionCompletionSchema = z.object({ ...inputShape(DEACCESSION_COMPLETION_FIELDS), version: z.number().int().min(1) });
export const deaccessionWithdrawSchema = z.object({ why: z.string().trim().min(3, 'Say why the proposal is withdrawn').max(2000), version: z.number().int().min(1) });

export const deaccessionSchema = z.object({
  id, printId: id, accessionNumber: z.string(), printTitle: z.string(),
  status: z.enum(DEACCESSION_STATUS.codes),
  proposedOn: isoDate, proposedBy: z.string(), reason: z.string(), method: z.enum(DEACCESSION_METHOD.codes), recipient: z.string().nullable(),
  authority: z.string().nullable(), approvedOn: isoDate.nullable(),
  completedOn: isoDate.nullable(), completedBy: z.string().nullable(), finalNote: z.string().nullable(),
  withdrawnWhy: z.string().nullable(),
  version: z.number().int(), createdAt: z.string().datetime(), updatedAt: z.string().datetime(),
});
export type Deaccession = z.infer<typeof deaccessionSchema>;
