import type { Request } from 'express';
import { iiifApi } from '@toneledger/common/api/iiif';
import { implement, type RouteDef } from '../../http/route';
import { imageInfo, imageRequest, iiifSourceFor } from '../../services/iiif-image.service';
import {
  exhibitionCollection, imageServiceIdOf, printManifest, savedSearchCollection, searchCollection,
} from '../../services/iiif-presentation.service';
import type { AppDeps } from '../../deps';

/** Absolute ids come from the request's own origin (behind a proxy, `TRUST_PROXY` lets X-Forwarded-* speak). */
const originOf = (req: Request) => `${req.protocol}://${req.get('host')}`;

/** IIIF answers depend on the session's role (original or display copy): private, and varied by cookie. */
const PRIVATE = 'private, max-age=3600';

export function iiifRoutes(deps: AppDeps): RouteDef[] {
  return implement(iiifApi, {
    imageBase: async ({ params, req, res }) => {
      res.redirect(303, `${imageServiceIdOf(originOf(req), params.id)}/info.json`);
    },
    imageInfo: async ({ params, actor, req, res }) => {
      const source = await iiifSourceFor(deps.store, params.id, actor.role);
      res.setHeader('Cache-Control', 'private, max-age=300');
      res.setHeader('Vary', 'Cookie');
      res.setHeader('Link', '<http://iiif.io/api/image/3/level1.json>;rel="profile"');
      return imageInfo(imageServiceIdOf(originOf(req), params.id), source);
    },
    image: async ({ params, actor, res }) => {
      const { bytes, contentType, cache } = await imageRequest(deps.store, params.id, params, actor.role);
      res.setHeader('Content-Type', contentType);
      res.setHeader('Content-Length', String(bytes.length));
      res.setHeader('Cache-Control', PRIVATE);
      res.setHeader('Vary', 'Cookie');
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.setHeader('Link', '<http://iiif.io/api/image/3/level1.json>;rel="profile"');
      res.setHeader('X-Iiif-Cache', cache);
      res.end(bytes);
    },
    printManifest: async ({ params, actor, req }) => printManifest(deps.store, originOf(req), params.id, actor.role),
    exhibitionCollection: async ({ params, req }) => exhibitionCollection(originOf(req), params.id),
    savedSearchCollection: async ({ params, actor, req }) => savedSearchCollection(originOf(req), params.id, actor),
    searchCollection: async ({ query, actor, req }) => {
      const raw = req.originalUrl.includes('?') ? req.originalUrl.slice(req.originalUrl.indexOf('?') + 1) : '';
      return searchCollection(originOf(req), query, raw, actor.role);
    },
  });
}
