import { z } from 'zod';
import { id, isoDate } from './primitives';

export const VIEW_TYPES = ['recto', 'verso', 'raking_light', 'uv_fluorescence', 'transmitted_light', 'detail', 'before_treatment', 'after_treatment'] as const;
export const VIEW_TYPE_LABELS: Record<(typeof VIEW_TYPES)[number], string> = {
  recto: 'Recto', verso: 'Verso', raking_light: 'Raking light', uv_fluorescence: 'UV fluorescence', transmitted_light: 'Transmitted light',
  detail: 'Detail', before_treatment: 'Before treatment', after_treatment: 'After treatment',
};
export const ACCEPTED_IMAGE_TYPES = ['image/jpeg', 'image/png', 'image/tiff', 'image/webp'] as const;


export const imageUploadFieldsSchema = z.object({
  viewType: z.enum(VIEW_TYPES),
  capturedOn: z.preprocess((v) => (v === '' ? undefined : v), isoDate.optional()),
  notes: z.preprocess((v) => (v === '' ? undefined : v), z.string().trim().max(2000).optional()),
});

export const imageUpdateSchema = z.object({
  viewType: z.enum(VIEW_TYPES).optional(),
  capturedOn: isoDate.nullable().optional(),
  notes: z.string().trim().max(2000).nullable().optional(),
  version: z.number().int().min(1),
});

export const imageDeleteSchema = z.object({ reason: z.string().trim().min(3, 'Say why the image is withdrawn').max(500), version: z.number().int().min(1) });

export const exifSummarySchema = z.object({
  capturedAt: z.string().nullable(), make: z.string().nullable(), model: z.string().nullable(), lens: z.string().nullable(),
  exposureTime: z.number().nullable(), fNumber: z.number().nullable(), iso: z.number().nullable(), focalLength: z.number().nullable(),
});

export const fixityResultSchema = z.object({
  id: z.string(), checkedAt: z.string().datetime(), ok: z.boolean(), outcome: z.enum(['match', 'mismatch', 'missing', 'error']),
  expected: z.string(), actual: z.string().nullable(), detail: z.string().nullable(),
});
export type FixityResult = z.infer<typeof fixityResultSchema>;

export const imageSchema = z.object({
  id, printId: id, viewType: z.enum(VIEW_TYPES), capturedOn: isoDate.nullable(), notes: z.string().nullable(),
  fileName: z.string(), contentType: z.string(), sizeBytes: z.number().int(), width: z.number().int(), height: z.number().int(),
  sha256: z.string().regex(/^[0-9a-f]{64}$/), exif: exifSummarySchema,
  derivatives: z.enum(['pending', 'ready', 'failed']),
  urls: z.object({ thumb: z.string().nullable(), screen: z.string().nullable(), original: z.string().nullable() }),
  lastFixity: fixityResultSchema.nullable(),
  uploadedAt: z.string().datetime(), uploadedBy: z.string().nullable(),
  withdrawn: z.object({ at: z.string().datetime(), by: z.string().nullable(), reason: z.string(), purgeAfter: z.string().datetime() }).nullable(),
  /** Capture dates voided as mistaken, oldest first: each kept with its reason and shown struck through. */
  voidedCaptureDates: z.array(z.object({ capturedOn: isoDate, at: z.string().datetime(), by: z.string(), reason: z.string() })).optional(),
  version: z.number().int(),
});
export type PrintImage = z.infer<typeof imageSchema>;

export const alignmentInputSchema = z.object({
  baseImageId: id, otherImageId: id,
  offsetX: z.number().min(-1).max(1), offsetY: z.number().min(-1).max(1), scale: z.number().min(0.1).max(10), rotationDeg: z.number().min(-45).max(45).default(0),
});
export const alignmentSchema = alignmentInputSchema.extend({ id, savedBy: z.string().nullable(), savedAt: z.string().datetime() });
export type Alignment = z.infer<typeof alignmentSchema>;

export const fixityAlertSchema = z.object({
  imageId: id, printId: id, accessionNumber: z.string(), viewType: z.enum(VIEW_TYPES), result: fixityResultSchema,
});

export const timelineEntrySchema = z.object({
  at: z.string().datetime(), kind: z.enum(['catalogue', 'movement', 'condition', 'addendum', 'image', 'fixity']),
  title: z.string(), detail: z.string().nullable(), actorName: z.string().nullable(), link: z.string().nullable(),
});
export type TimelineEntry = z.infer<typeof timelineEntrySchema>;
