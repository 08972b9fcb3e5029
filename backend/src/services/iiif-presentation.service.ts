import { QueryTypes } from 'sequelize';
import type { ObjectStore } from '@toneledger/storage/object-store';
import type { Role } from '@toneledger/common/domain/roles';
import { PROCESS } from '@toneledger/common/schemas/vocab';
import { canonicalRights, rightsLabel } from '@toneledger/common/domain/rights';
import { VIEW_TYPE_LABELS } from '@toneledger/common/schemas/images';
import { printListQuerySchema, type PrintListQuery } from '@toneledger/common/schemas/catalogue';
import {
  IIIF_COLLECTION_LIMIT, IIIF_PRESENTATION_CONTEXT, type IiifCollection, type IiifManifest, type LanguageMap,
} from '@toneledger/common/schemas/iiif';
import { db } from '../db';
import { Exhibition } from '../models';
import { conflict, notFound } from '../errors';
import { getPrint } from './print.service';
import { listImages } from './image.service';
import { iiifSourceFor } from './iiif-image.service';
import { listPrints } from './print-list.service';

/**
 * IIIF Presentation API 3.0 documents (rules recalled from memory of the 3.0 text, §3 and §4):
 * a Manifest per print whose Canvases are its images in capture order, each painted by one
 * Annotation whose Image body names the image service; Collections list Manifests. Every id is
 * absolute, built from the request's origin. Language maps use "en" for the product's own words
 * and "none" for values in no language (accession numbers).
 */

const en = (text: string): LanguageMap => ({ en: [text] });
const none = (text: string): LanguageMap => ({ none: [text] });

/**
 * A rights value as IIIF takes it (§3.3.2 `rights`): a Creative Commons or RightsStatements.org URI,
 * in its canonical http form (`domain/rights.ts`), goes in `rights`; anything else (a sentence, another
 * site's address, written before the contract checked the field) is shown as a metadata entry instead.
 */
export function rightsOf(text: string | null | undefined): { rights?: string; metadata?: { label: LanguageMap; value: LanguageMap } } {
  const value = text?.trim();
  if (!value) return {};
  const uri = canonicalRights(value);
  // `rights` is for machines (a viewer may show an icon); the statement's words go in metadata for people (§3.3.2).
  if (uri) return { rights: uri, metadata: { label: en('Rights statement'), value: en(rightsLabel(uri)!) } };
  return { metadata: { label: en('Rights'), value: en(value) } };
}

export const manifestIdOf = (origin: string, printId: string) => `${origin}/api/iiif/prints/${printId}/manifest`;
export const imageServiceIdOf = (origin: string, imageId: string) => `${origin}/api/iiif/images/${imageId}`;

export async function printManifest(store: ObjectStore, origin: string, printId: string, role: Role | null): Promise<IiifManifest> {
  const print = await getPrint(printId, role);
  const images = await listImages(printId, role, false);
  const manifestId = manifestIdOf(origin, printId);
  const canvases: IiifManifest['items'] = [];
  for (const image of images) {
    let service;
    try {
      service = await iiifSourceFor(store, image.id, role);
    } catch {
      continue; // A display copy still being made (or a purged file): no canvas until it is there.
    }
    const canvasId = `${manifestId}/canvas/${image.id}`;
    const serviceId = imageServiceIdOf(origin, image.id);
    canvases.push({
      id: canvasId,
      type: 'Canvas',
      label: en([VIEW_TYPE_LABELS[image.viewType], image.capturedOn].filter(Boolean).join(', ')),
      // The canvas is the image's own coordinate space; a display copy paints it whole, at its own size.
      width: image.width,
      height: image.height,
      ...(image.urls.thumb ? { thumbnail: [{ id: `${origin}${image.urls.thumb}`, type: 'Image' as const, format: 'image/webp' }] } : {}),
      items: [{
        id: `${canvasId}/page`,
        type: 'AnnotationPage',
        items: [{
          id: `${canvasId}/page/painting`,
          type: 'Annotation',
          motivation: 'painting',
          body: {
            id: `${serviceId}/full/max/0/default.jpg`, type: 'Image', format: 'image/jpeg', width: service.width, height: service.height,
            service: [{ id: serviceId, type: 'ImageService3', profile: 'level1' }],
          },
          target: canvasId,
        }],
      }],
    });
  }
  const process = print.process ? PROCESS.labels[print.process as keyof typeof PROCESS.labels] : null;
  const maker = print.maker?.name ?? null;
  const metadata: IiifManifest['metadata'] = [
    { label: en('Accession number'), value: none(print.accessionNumber) },
    { label: en('Maker'), value: en(maker ?? 'Unknown') },
    ...(print.dateDisplay ? [{ label: en('Date made'), value: en(print.dateDisplay) }] : []),
    ...(process ? [{ label: en('Process'), value: en(process) }] : []),
  ];
  const rights = rightsOf(print.rights);
  if (rights.metadata) metadata.push(rights.metadata);
  const summary = [maker ?? 'Maker unknown', print.dateDisplay, process].filter(Boolean).join(', ');
  const first = canvases[0]?.thumbnail;
  return {
    '@context': IIIF_PRESENTATION_CONTEXT,
    id: manifestId,
    type: 'Manifest',
    label: en(print.title),
    summary: en(`${summary}. Accession number ${print.accessionNumber}.`),
    metadata,
    ...(print.creditLine ? { requiredStatement: { label: en('Credit line'), value: en(print.creditLine) } } : {}),
    ...(rights.rights ? { rights: rights.rights } : {}),
    ...(first ? { thumbnail: first } : {}),
    homepage: [{ id: `${origin}/catalogue/prints/${printId}`, type: 'Text', label: en(`${print.accessionNumber} in the catalogue`), format: 'text/html' }],
    items: canvases,
  };
}

interface ManifestRef { id: string; accessionNumber: string; title: string; thumbImageId: string | null }

function collectionItems(origin: string, rows: ManifestRef[]): IiifCollection['items'] {
  return rows.map((r) => ({
    id: manifestIdOf(origin, r.id),
    type: 'Manifest' as const,
    label: en(`${r.accessionNumber} ${r.title}`),
    ...(r.thumbImageId ? { thumbnail: [{ id: `${origin}/api/images/${r.thumbImageId}/file/thumb`, type: 'Image' as const, format: 'image/webp' }] } : {}),
  }));
}

const THUMB_SQL = `(SELECT i.id FROM images i WHERE i.print_id = p.id AND i.withdrawn_at IS NULL AND i.thumb_key IS NOT NULL
                     ORDER BY i.captured_on NULLS LAST, i.uploaded_at LIMIT 1)`;

export async function exhibitionCollection(origin: string, exhibitionId: string): Promise<IiifCollection> {
  const e = await Exhibition.findByPk(exhibitionId);
  if (!e) throw notFound('The exhibition');
  const rows = await db().query<{ id: string; accession_number: string; title: string; thumb: string | null }>(
    `SELECT p.id, p.accession_number, p.title, ${THUMB_SQL} AS thumb
       FROM exhibition_objects o JOIN prints p ON p.id = o.print_id WHERE o.exhibition_id = $1 ORDER BY p.accession_sort`,
    { bind: [exhibitionId], type: QueryTypes.SELECT },
  );
  return {
    '@context': IIIF_PRESENTATION_CONTEXT,
    id: `${origin}/api/iiif/exhibitions/${exhibitionId}/collection`,
    type: 'Collection',
    label: en(e.title),
    summary: en(`${rows.length} print${rows.length === 1 ? '' : 's'} in the exhibition${e.organiser ? `, organised by ${e.organiser}` : ''}.`),
    items: collectionItems(origin, rows.map((r) => ({ id: r.id, accessionNumber: r.accession_number, title: r.title, thumbImageId: r.thumb }))),
  };
}

/** A catalogue search (the list's own query) as a collection: its prints in the list's order, at most IIIF_COLLECTION_LIMIT. */
export async function searchCollection(
  origin: string,
  query: PrintListQuery,
  queryString: string,
  role: Role | null,
  named?: { id: string; label: string },
): Promise<IiifCollection> {
  const pageSize = 500;
  const refs: ManifestRef[] = [];
  let total = 0;
  let estimated = false;
  for (let page = 1; refs.length < IIIF_COLLECTION_LIMIT; page += 1) {
    const result = await listPrints({ ...query, page, pageSize }, role);
    total = result.total;
    estimated = result.estimated;
    refs.push(...result.rows.map((r) => ({ id: r.id, accessionNumber: r.accessionNumber, title: r.title, thumbImageId: null })));
    if (result.rows.length < pageSize) break;
  }
  const shown = refs.slice(0, IIIF_COLLECTION_LIMIT);
  if (shown.length) {
    const thumbs = await db().query<{ id: string; thumb: string | null }>(`SELECT p.id, ${THUMB_SQL} AS thumb FROM prints p WHERE p.id = ANY($1)`, {
      bind: [shown.map((r) => r.id)], type: QueryTypes.SELECT,
    });
    const byId = new Map(thumbs.map((t) => [t.id, t.thumb]));
    for (const r of shown) r.thumbImageId = byId.get(r.id) ?? null;
  }
  const more = total > shown.length;
  return {
    '@context': IIIF_PRESENTATION_CONTEXT,
    id: named?.id ?? `${origin}/api/iiif/catalogue/collection${queryString ? `?${queryString}` : ''}`,
    type: 'Collection',
    label: en(named?.label ?? (query.q ? `Catalogue search: ${query.q}` : 'Catalogue search')),
    summary: en(more
      ? `The first ${shown.length} of ${estimated ? 'about ' : ''}${total} prints found, in the list's order.`
      : `${shown.length} print${shown.length === 1 ? '' : 's'} found, in the list's order.`),
    items: collectionItems(origin, shown),
  };
}

/** A saved search as a collection: its owner's, or anyone's when shared (otherwise not found, as the saved search itself). */
export async function savedSearchCollection(origin: string, id: string, actor: { id: string; role: Role }): Promise<IiifCollection> {
  const [row] = await db().query<{ name: string; query: unknown; shared: boolean; owner_id: string }>(
    'SELECT name, query, shared, owner_id FROM saved_searches WHERE id = $1',
    { bind: [id], type: QueryTypes.SELECT },
  );
  if (!row || (!row.shared && row.owner_id !== actor.id)) throw notFound('The saved search');
  const query = printListQuerySchema.safeParse(row.query ?? {});
  if (!query.success) throw conflict('The saved search holds a query this version cannot read; save it again from the catalogue.');
  return searchCollection(origin, query.data, '', actor.role, { id: `${origin}/api/iiif/saved-searches/${id}/collection`, label: row.name });
}
