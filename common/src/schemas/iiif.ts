import { z } from 'zod';
import { id } from './primitives';

/**
 * IIIF documents as this server writes them. These are not the project's `{ data }` envelope: a
 * IIIF client reads the bare JSON, so the contract's response schema is the document itself.
 */

export const IIIF_IMAGE_CONTEXT = 'http://iiif.io/api/image/3/context.json';
export const IIIF_PRESENTATION_CONTEXT = 'http://iiif.io/api/presentation/3/context.json';
export const IIIF_IMAGE_PROTOCOL = 'http://iiif.io/api/image';

/** A language map: { "en": ["…"] }, or { "none": ["…"] } for values in no language (accession numbers). */
export const languageMapSchema = z.record(z.string(), z.array(z.string()));
export type LanguageMap = z.infer<typeof languageMapSchema>;

const sizeSchema = z.object({ width: z.number().int().positive(), height: z.number().int().positive() });

/** Image API 3.0 §5, the image information document (info.json). */
export const iiifImageInfoSchema = z.object({
  '@context': z.literal(IIIF_IMAGE_CONTEXT),
  id: z.string().url(),
  type: z.literal('ImageService3'),
  protocol: z.literal(IIIF_IMAGE_PROTOCOL),
  profile: z.enum(['level0', 'level1', 'level2']),
  width: z.number().int().positive(),
  height: z.number().int().positive(),
  maxWidth: z.number().int().positive().optional(),
  maxHeight: z.number().int().positive().optional(),
  maxArea: z.number().int().positive().optional(),
  sizes: z.array(sizeSchema),
  tiles: z.array(z.object({ width: z.number().int().positive(), height: z.number().int().positive().optional(), scaleFactors: z.array(z.number().int().positive()) })),
  extraQualities: z.array(z.string()).optional(),
  extraFormats: z.array(z.string()).optional(),
  preferredFormats: z.array(z.string()).optional(),
  extraFeatures: z.array(z.string()).optional(),
});
export type IiifImageInfo = z.infer<typeof iiifImageInfoSchema>;

/** The path segments of an image request; each is parsed by `common/src/domain/iiif-image.ts`. */
export const iiifImageRequestParamsSchema = z.object({
  id,
  region: z.string().max(100),
  size: z.string().max(100),
  rotation: z.string().max(20),
  file: z.string().max(20),
});

const serviceRefSchema = z.object({ id: z.string().url(), type: z.literal('ImageService3'), profile: z.string() });
const imageBodySchema = z.object({
  id: z.string().url(), type: z.literal('Image'), format: z.string(), width: z.number().int().positive(), height: z.number().int().positive(),
  service: z.array(serviceRefSchema),
});
const thumbnailSchema = z.object({ id: z.string().url(), type: z.literal('Image'), format: z.string() });

export const iiifCanvasSchema = z.object({
  id: z.string().url(),
  type: z.literal('Canvas'),
  label: languageMapSchema,
  width: z.number().int().positive(),
  height: z.number().int().positive(),
  thumbnail: z.array(thumbnailSchema).optional(),
  items: z.array(z.object({
    id: z.string().url(),
    type: z.literal('AnnotationPage'),
    items: z.array(z.object({
      id: z.string().url(), type: z.literal('Annotation'), motivation: z.literal('painting'), body: imageBodySchema, target: z.string().url(),
    })),
  })),
});

const metadataEntrySchema = z.object({ label: languageMapSchema, value: languageMapSchema });

/** Presentation API 3.0 §3, a Manifest. */
export const iiifManifestSchema = z.object({
  '@context': z.literal(IIIF_PRESENTATION_CONTEXT),
  id: z.string().url(),
  type: z.literal('Manifest'),
  label: languageMapSchema,
  summary: languageMapSchema.optional(),
  metadata: z.array(metadataEntrySchema),
  requiredStatement: metadataEntrySchema.optional(),
  rights: z.string().url().optional(),
  thumbnail: z.array(thumbnailSchema).optional(),
  homepage: z.array(z.object({ id: z.string().url(), type: z.literal('Text'), label: languageMapSchema, format: z.literal('text/html') })).optional(),
  items: z.array(iiifCanvasSchema),
});
export type IiifManifest = z.infer<typeof iiifManifestSchema>;

/** Presentation API 3.0, a Collection of Manifests. */
export const iiifCollectionSchema = z.object({
  '@context': z.literal(IIIF_PRESENTATION_CONTEXT),
  id: z.string().url(),
  type: z.literal('Collection'),
  label: languageMapSchema,
  summary: languageMapSchema.optional(),
  items: z.array(z.object({ id: z.string().url(), type: z.literal('Manifest'), label: languageMapSchema, thumbnail: z.array(thumbnailSchema).optional() })),
});
export type IiifCollection = z.infer<typeof iiifCollectionSchema>;

/** The most prints a saved search's collection lists; the summary says when there were more. */
export const IIIF_COLLECTION_LIMIT = 1000;
