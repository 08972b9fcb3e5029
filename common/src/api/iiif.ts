import { printListQuerySchema } from '../schemas/catalogue';
import { iiifCollectionSchema, iiifImageInfoSchema, iiifImageRequestParamsSchema, iiifManifestSchema } from '../schemas/iiif';
import { idParamsSchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

/**
 * IIIF: the Image API 3.0 over each image (roles with `images.original` get the original, every
 * other reader the display copy) and Presentation API 3.0 documents (a manifest per print, a
 * collection per exhibition or catalogue search). The documents are bare IIIF JSON, not the
 * `{ data }` envelope; errors keep the envelope.
 */
export const iiifApi = {
  imageBase: endpoint({
    method: 'get', path: '/api/iiif/images/:id', summary: "An image service's base address: 303 to its info.json", tags: ['iiif'],
    access: 'images.read', params: idParamsSchema, status: 303, response: { description: 'Redirect to info.json', contentType: 'text/plain' },
  }),
  imageInfo: endpoint({
    method: 'get', path: '/api/iiif/images/:id/info.json',
    summary: 'IIIF Image API 3.0 image information (level 1 and more); for roles without originals, the display copy with maxWidth/maxHeight', tags: ['iiif'],
    access: 'images.read', params: idParamsSchema, response: { description: 'info.json', schema: iiifImageInfoSchema },
  }),
  image: endpoint({
    method: 'get', path: '/api/iiif/images/:id/:region/:size/:rotation/:file',
    summary: 'IIIF Image API 3.0 image request: {region}/{size}/{rotation}/{quality}.{format} (jpg, png, webp); made once, then served from storage', tags: ['iiif'],
    access: 'images.read', params: iiifImageRequestParamsSchema, response: { description: 'Image bytes', contentType: 'image/*' },
  }),
  printManifest: endpoint({
    method: 'get', path: '/api/iiif/prints/:id/manifest', summary: "IIIF Presentation API 3.0 manifest of a print: its images as canvases in capture order", tags: ['iiif'],
    access: 'images.read', params: idParamsSchema, response: { description: 'Manifest', schema: iiifManifestSchema },
  }),
  exhibitionCollection: endpoint({
    method: 'get', path: '/api/iiif/exhibitions/:id/collection', summary: "IIIF Presentation API 3.0 collection of an exhibition's prints", tags: ['iiif'],
    access: 'loans.read', params: idParamsSchema, response: { description: 'Collection', schema: iiifCollectionSchema },
  }),
  savedSearchCollection: endpoint({
    method: 'get', path: '/api/iiif/saved-searches/:id/collection',
    summary: 'IIIF Presentation API 3.0 collection of a saved catalogue search (its owner, or anyone when shared; at most 1000 prints)', tags: ['iiif'],
    access: 'catalogue.read', params: idParamsSchema, response: { description: 'Collection', schema: iiifCollectionSchema },
  }),
  searchCollection: endpoint({
    method: 'get', path: '/api/iiif/catalogue/collection',
    summary: 'IIIF Presentation API 3.0 collection of a catalogue search (the list query; page ignored, at most 1000 prints)', tags: ['iiif'],
    access: 'catalogue.read', query: printListQuerySchema, response: { description: 'Collection', schema: iiifCollectionSchema },
  }),
};
