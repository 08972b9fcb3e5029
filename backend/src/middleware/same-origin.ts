import type { NextFunction, Request, Response } from 'express';
import { forbidden } from '../errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cookie-authenticated writes must come from our own pages: the Origin header (or, failing that,
 * the Referer) has to name one of the allowed origins. Browsers always send Origin on
 * cross-origin and on same-origin non-GET fetches, so a missing header is refused too.
 */
export function sameOriginWrites(allowed: string[]) {
  const origins = new Set(allowed.map((o) => new URL(o).origin));
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const origin = req.get('origin');
    let source: string | null = null;
    if (origin && origin !== 'null') source = origin;
    else {
      const referer = req.get('referer');
      if (referer) {
        try {
          source = new URL(referer).origin;
        } catch {
          source = null;
        }
      }
    }
    if (!source || !origins.has(source)) {
      return next(forbidden('Cross-site request refused: this change must come from a Toneledger page.'));
    }
    next();
  };
}
