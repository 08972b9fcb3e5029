import { iiifApi } from '@toneledger/common/api/iiif';
import { urlOf } from '@/lib/api-client';

/** The IIIF info.json address of an image (the deep-zoom viewer opens it). */
export const iiifInfoUrl = (imageId: string) => urlOf(iiifApi.imageInfo, { params: { id: imageId } });

/** The absolute address of a print's IIIF manifest, to paste into any IIIF viewer. */
export const iiifManifestUrl = (printId: string) => new URL(urlOf(iiifApi.printManifest, { params: { id: printId } }), window.location.origin).href;
